import pkg from "@/package.json";

export const CAUTION_LINE = "Results are design aids. Verification under the governing standard and local codes by a qualified person decides.";

export function Footer() {
  return (
    <footer className="border-t border-fen-200 bg-white/60">
      <div className="mx-auto flex max-w-7xl flex-col gap-1 px-4 py-4 text-xs text-fen-600 sm:flex-row sm:items-center sm:justify-between sm:px-6">
        <p className="flex items-start gap-2">
          <span aria-hidden="true" className="mt-0.5 inline-block h-2 w-2 shrink-0 rotate-45 bg-amberline-500" />
          <span>{CAUTION_LINE}</span>
        </p>
        <p className="font-mono text-fen-400">Ohmstead {pkg.version}</p>
      </div>
    </footer>
  );
}
