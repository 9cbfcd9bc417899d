import type { Check } from "@/lib/engine/core/result";
import type { UnitSystem } from "@/lib/sheets/units";
import { fmt, pct } from "./format";

/** Pass/fail of each check against its limit, with the margin. */
export function ChecksList({ checks, unitSystem }: { checks: readonly Check[]; unitSystem: UnitSystem }) {
  if (checks.length === 0) return null;
  return (
    <ul className="space-y-2" aria-label="Checks">
      {checks.map((c) => (
        <li
          key={c.id}
          data-check={c.id}
          data-pass={c.pass}
          className={`flex flex-wrap items-center justify-between gap-2 rounded-md border px-3 py-2 text-sm ${
            c.pass ? "border-verdigris-100 bg-verdigris-50" : "border-signal-100 bg-signal-50"
          }`}
        >
          <span className="flex items-center gap-2">
            <span className={`badge ${c.pass ? "bg-verdigris-600 text-white" : "bg-signal-600 text-white"}`}>{c.pass ? "PASS" : "FAIL"}</span>
            <span className="font-medium text-fen-900">{c.label}</span>
          </span>
          <span className="tabular-nums text-fen-700">
            {fmt(c.value, c.unit, unitSystem)} {c.kind === "max" ? "≤" : "≥"} {fmt(c.limit, c.unit, unitSystem)}
            <span className={`ml-2 text-xs ${c.pass ? "text-verdigris-700" : "text-signal-700"}`}>margin {pct(c.margin)}</span>
          </span>
        </li>
      ))}
    </ul>
  );
}
