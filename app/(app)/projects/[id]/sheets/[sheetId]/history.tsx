import { DateTime } from "@/components/ui/date-time";
import type { SheetHistoryEntry } from "@/lib/sheets/service";

const EVENT_TEXT: Partial<Record<SheetHistoryEntry["event"], string>> = {
  "sheet.created": "created the sheet",
  "sheet.saved": "saved",
  "sheet.submitted": "submitted for review",
  "sheet.approved": "approved",
  "sheet.returned": "returned",
  "sheet.revised": "started a new revision",
  "sheet.superseded": "superseded",
};

function describe(e: SheetHistoryEntry): string {
  if (e.transition === "withdraw") return "withdrew from review";
  if (e.event === "network.imported") {
    const file = e.details.file as { fileName?: unknown } | undefined;
    return typeof file?.fileName === "string" ? `imported the network file “${file.fileName}”` : "imported a network file";
  }
  return EVENT_TEXT[e.event] ?? e.event.replace(/^sheet\./, "");
}

/** The sheet's history, newest first, with review comments in full. */
export function SheetHistory({ entries }: { entries: readonly SheetHistoryEntry[] }) {
  const list = [...entries].reverse();
  return (
    <section className="panel p-5" aria-labelledby="sheet-history">
      <h2 id="sheet-history" className="mb-3 text-xs font-semibold uppercase tracking-wider text-fen-500">
        History and review comments
      </h2>
      {list.length === 0 ? (
        <p className="text-sm text-fen-500">Nothing recorded yet.</p>
      ) : (
        <ol className="space-y-3">
          {list.map((e) => (
            <li key={e.id} className="text-sm">
              <div className="text-fen-800">
                <span className="font-medium">{e.actorName ?? "Someone"}</span> {describe(e)}
                {e.label ? <span className="font-mono text-fen-600"> · rev {e.label}</span> : null}
              </div>
              <div className="text-xs text-fen-500">
                <DateTime value={e.createdAt} />
              </div>
              {e.comment ? (
                <blockquote className="mt-1 whitespace-pre-wrap rounded-md border-l-4 border-copper-300 bg-copper-50 px-3 py-2 text-fen-800" data-review-comment>
                  {e.comment}
                </blockquote>
              ) : null}
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
