import type { ReactNode } from "react";
import type { CalcResult } from "@/lib/engine/core/result";
import type { UnitSystem } from "@/lib/sheets/units";
import { Caution } from "./Caution";
import { ChecksList } from "./checks";
import { fmt } from "./format";

export type ResultSource = "live" | "saved" | "stale";

/**
 * A calculation result: pass/fail checks, warnings, the kind's key results (`children`),
 * the intermediate values, and the method (formulas with their sources) folded under
 * "Method", with the caution where the result is thermal, fault or voltage drop.
 */
export function ResultsPanel({
  result,
  unitSystem,
  cautioned,
  children,
  header,
}: {
  result: CalcResult<unknown>;
  unitSystem: UnitSystem;
  cautioned: boolean;
  children?: ReactNode;
  header?: ReactNode;
}) {
  const intermediates = Object.entries(result.intermediates);
  return (
    <div className="space-y-4" data-results={result.kind}>
      {header}
      {cautioned ? <Caution /> : null}
      <ChecksList checks={result.checks} unitSystem={unitSystem} />
      {result.warnings.length > 0 ? (
        <section aria-label="Warnings" className="rounded-md border border-amberline-100 bg-amberline-50 px-3 py-2">
          <h3 className="text-xs font-semibold uppercase tracking-wider text-amberline-700">Warnings</h3>
          <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-amberline-700">
            {result.warnings.map((w, i) => (
              <li key={`${w.code}-${i}`} data-warning={w.code}>
                {w.message}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {children}
      {intermediates.length > 0 ? (
        <details className="rounded-md border border-fen-200 bg-white">
          <summary className="cursor-pointer px-3 py-2 text-sm font-semibold text-fen-800">Intermediate values</summary>
          <table className="data-table">
            <tbody>
              {intermediates.map(([id, q]) => (
                <tr key={id}>
                  <td className="text-fen-600">{q.label}</td>
                  <td className="text-right font-mono tabular-nums">{fmt(q.value, q.unit, unitSystem)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </details>
      ) : null}
      <details className="rounded-md border border-fen-200 bg-white">
        <summary className="cursor-pointer px-3 py-2 text-sm font-semibold text-fen-800">Method</summary>
        <ol className="space-y-3 px-3 pb-3">
          {result.formulas.map((f) => (
            <li key={f.id} className="text-sm">
              <div className="font-mono text-fen-900">{f.expression}</div>
              <div className="text-xs text-fen-500">Source: {f.source}</div>
            </li>
          ))}
        </ol>
        <p className="px-3 pb-3 text-xs text-fen-500">Engine version {result.engineVersion}.</p>
      </details>
    </div>
  );
}

/** A grid of headline values. */
export function KeyValues({ items }: { items: readonly { label: string; value: string; emphasis?: boolean; testId?: string }[] }) {
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3">
      {items.map((it) => (
        <div key={it.label} className={`rounded-md border px-3 py-2 ${it.emphasis ? "border-copper-200 bg-copper-50" : "border-fen-200 bg-white"}`}>
          <dt className="text-xs text-fen-500">{it.label}</dt>
          <dd className="font-mono text-lg font-semibold tabular-nums text-fen-950" data-testid={it.testId}>
            {it.value}
          </dd>
        </div>
      ))}
    </dl>
  );
}
