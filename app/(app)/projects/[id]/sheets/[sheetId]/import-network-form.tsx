"use client";

import { useRouter } from "next/navigation";
import { useId, useState, useTransition } from "react";
import { importNetworkAction } from "./actions";

/** The file format, for the hint under the file field. */
const CSV_HINT =
  "CSV: a header row and one record per row; the record column says setting, conductor, segment, load or supply. Conductor rows: id, material, area_mm2, count, temperature_C, reactance_mohm_per_m, ampacity_A. Segment rows: id, from, to, conductor, length_m. Load rows: node, current_A, pf. Supply rows: node, voltage_V. Setting rows: name (mode, frequency_Hz, ambient_C, maxTemperature_C, dropLimit_pct) and value. JSON: the calculation's own input (as downloaded). At most 30 MB.";

/**
 * Imports a network file into a bus network sheet: the server reads and solves it and
 * stores it as the sheet's draft (or a new revision of an approved sheet). A refused
 * file changes nothing; its problems are listed by row and column.
 */
export function ImportNetworkForm({
  projectId,
  sheetId,
  version,
  canImport,
  downloadHref,
  replacesUnsaved = false,
}: {
  projectId: number;
  sheetId: number;
  version: number;
  canImport: boolean;
  /** Where the current network downloads as JSON. */
  downloadHref: string;
  /** The form above may hold unsaved edits the import replaces. */
  replacesUnsaved?: boolean;
}) {
  const router = useRouter();
  const id = useId();
  const [pending, startTransition] = useTransition();
  const [problems, setProblems] = useState<{ list: string[]; more: number } | null>(null);
  const [done, setDone] = useState<string | null>(null);

  function submit(form: FormData) {
    setProblems(null);
    setDone(null);
    startTransition(async () => {
      const r = await importNetworkAction(form);
      if (!r.ok) {
        const fields = Object.entries(r.error.fields ?? {}).map(([k, m]) => (k === "file" || k === "_" ? m : `${k}: ${m}`));
        setProblems({ list: fields.length ? [r.error.message, ...fields.filter((f) => f !== r.error.message)] : [r.error.message], more: 0 });
        return;
      }
      if (!r.data.imported) {
        setProblems({ list: r.data.problems, more: r.data.more });
        return;
      }
      const d = r.data;
      setDone(
        `Imported ${d.counts.nodes.toLocaleString("en")} nodes, ${d.counts.segments.toLocaleString("en")} segments and ${d.counts.loads.toLocaleString("en")} loads as ${d.newRevision ? "new " : ""}revision ${d.revision.label} (draft); solved on the server in ${d.solveMs.toLocaleString("en")} ms.`,
      );
      router.refresh();
    });
  }

  return (
    <section aria-labelledby={`${id}-title`} className="panel space-y-3 p-4" data-testid="network-import">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`${id}-title`} className="text-sm font-semibold uppercase tracking-wider text-fen-600">
          Network file
        </h2>
        <a href={downloadHref} className="text-sm text-copper-800 hover:underline" download>
          Download the current network (JSON)
        </a>
      </div>
      {canImport ? (
        <form action={submit} className="space-y-2">
          <input type="hidden" name="projectId" value={projectId} />
          <input type="hidden" name="sheetId" value={sheetId} />
          <input type="hidden" name="version" value={version} />
          <div>
            <label htmlFor={`${id}-file`} className="field-label">
              Import a network (.csv or .json)
            </label>
            <input
              id={`${id}-file`}
              name="file"
              type="file"
              accept=".csv,.json,text/csv,application/json"
              required
              className="field-input"
              aria-invalid={problems ? true : undefined}
              aria-describedby={`${id}-hint${problems ? ` ${id}-problems` : ""}`}
            />
            <p id={`${id}-hint`} className="field-hint">
              {CSV_HINT}
              {replacesUnsaved ? " Importing replaces the whole network, including unsaved edits in the tables above." : " Importing replaces the whole network."}
            </p>
          </div>
          <button type="submit" className="btn-secondary" disabled={pending}>
            {pending ? "Importing and solving…" : "Import and solve"}
          </button>
        </form>
      ) : null}
      {problems ? (
        <div id={`${id}-problems`} role="alert" className="rounded-md border border-signal-500/40 bg-signal-50 px-3 py-2 text-sm text-signal-700">
          <p className="font-semibold">The file was not imported; the sheet is unchanged.</p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            {problems.list.map((p, i) => (
              <li key={i}>{p}</li>
            ))}
          </ul>
          {problems.more > 0 ? <p className="mt-1">… and {problems.more} more problems.</p> : null}
        </div>
      ) : null}
      {done ? (
        <p role="status" className="text-sm text-verdigris-700">
          {done}
        </p>
      ) : null}
    </section>
  );
}
