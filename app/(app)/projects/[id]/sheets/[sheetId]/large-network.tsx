import type { ReactNode } from "react";
import { BusNetworkSummaryResults } from "@/components/sheets/results/bus-network-tables";
import { summaryOfNetworkResults } from "@/components/sheets/results/network-summary";
import { ResultsPanel } from "@/components/sheets/results/results-panel";
import type { CalcResult } from "@/lib/engine/core/result";
import type { NetworkResults } from "@/lib/engine/network";
import type { SheetHistoryEntry } from "@/lib/sheets/service";
import type { UnitSystem } from "@/lib/sheets/units";

const count = (inputs: Record<string, unknown>, key: string) => (Array.isArray(inputs[key]) ? (inputs[key] as unknown[]).length : 0);

/**
 * A bus network too large for the form (rendered on the server): its size, the
 * server's stored result (key values, hottest segments, branches without current,
 * warnings and checks) and when and how fast it was solved. Only this summary goes to
 * the browser, not the network or its full result.
 */
export function LargeNetworkSummary({
  inputs,
  result,
  revisionId,
  history,
  unitSystem,
  importForm,
}: {
  inputs: Record<string, unknown>;
  result: CalcResult<unknown> | null;
  revisionId: number;
  history: readonly SheetHistoryEntry[];
  unitSystem: UnitSystem;
  importForm: ReactNode;
}) {
  const imported = [...history].reverse().find((h) => h.event === "network.imported" && h.details.revisionId === revisionId);
  const solveMs = typeof imported?.details.solveMs === "number" ? imported.details.solveMs : undefined;
  const file = imported?.details.file as { fileName?: string } | undefined;
  const sizes = [
    { label: "Nodes", value: count(inputs, "nodes") },
    { label: "Segments", value: count(inputs, "segments") },
    { label: "Loads", value: count(inputs, "loads") },
    { label: "Supplies", value: count(inputs, "supplies") },
    { label: "Conductor specs", value: count(inputs, "conductors") },
  ];
  const summary = result ? summaryOfNetworkResults(result.results as NetworkResults) : null;
  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]" data-testid="large-network">
      <div className="space-y-4">
        <section className="panel space-y-3 p-4" aria-labelledby="large-network-title">
          <h2 id="large-network-title" className="text-sm font-semibold uppercase tracking-wider text-fen-600">
            Large network
          </h2>
          <p className="text-sm text-fen-700">
            This network is too large to edit as tables in the browser. It is solved on the server; to change it, edit the file and import it again.
          </p>
          <dl className="grid grid-cols-2 gap-2 sm:grid-cols-3">
            {sizes.map((s) => (
              <div key={s.label} className="rounded-md border border-fen-200 px-3 py-2">
                <dt className="text-xs text-fen-500">{s.label}</dt>
                <dd className="font-mono text-lg font-semibold tabular-nums text-fen-950">{s.value.toLocaleString("en")}</dd>
              </div>
            ))}
          </dl>
          <p className="text-sm text-fen-700" data-testid="solved-on-server">
            {result ? "Solved on the server" : "Not solved: the stored inputs need attention"}
            {solveMs !== undefined ? ` in ${solveMs.toLocaleString("en")} ms` : ""}
            {imported ? ` when ${imported.actorName ?? "a user"} imported ${file?.fileName ? `“${file.fileName}”` : "a file"} on ${imported.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC` : ""}.
          </p>
        </section>
        {importForm}
      </div>
      <section aria-label="Results" className="space-y-3">
        <div className="flex items-center justify-between">
          <h2 className="text-sm font-semibold uppercase tracking-wider text-fen-600">Results</h2>
          <span className="badge bg-verdigris-50 text-verdigris-700 ring-1 ring-inset ring-verdigris-100" data-testid="result-source" data-source="saved">
            Saved result · server
          </span>
        </div>
        {result && summary ? (
          <ResultsPanel result={{ ...result, results: {} }} unitSystem={unitSystem} cautioned>
            <BusNetworkSummaryResults results={summary.results} counts={summary.counts} deadTotal={summary.deadTotal} unitSystem={unitSystem} />
          </ResultsPanel>
        ) : (
          <p className="panel p-4 text-sm text-fen-600">There is no stored result for this revision. Import a corrected file.</p>
        )}
      </section>
    </div>
  );
}
