/** A date and time shown the same on server and client (UTC, minutes), with the exact instant in the markup. */
export function DateTime({ value, dateOnly = false }: { value: Date | string; dateOnly?: boolean }) {
  const d = typeof value === "string" ? new Date(value) : value;
  if (Number.isNaN(d.getTime())) return <span>—</span>;
  const iso = d.toISOString();
  const text = dateOnly ? iso.slice(0, 10) : `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
  return (
    <time dateTime={iso} title={iso} className="tabular-nums">
      {text}
    </time>
  );
}
