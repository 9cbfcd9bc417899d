import "server-only";
import type { LossSource } from "@/components/sheets/forms/types";
import type { Actor } from "@/lib/auth/guard";
import { getRevision, listProjectSheets } from "@/lib/sheets/service";

/** How many other sheets are read for losses (each is one query). */
const MAX_SOURCES = 40;

const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : undefined);

/**
 * Losses the project's other sheets offer to an enclosure heat budget: a busbar
 * rating's W/m (with its phase count) and a feeder's total loss when its stored result
 * has one. The latest revision with a stored result is used.
 */
export async function lossSourcesFor(actor: Actor, projectId: number, exceptSheetId: number): Promise<LossSource[]> {
  const sheets = (await listProjectSheets(actor, projectId)).filter((s) => s.id !== exceptSheetId && (s.kind === "busbar-rating" || s.kind === "voltage-drop")).slice(0, MAX_SOURCES);
  const out: LossSource[] = [];
  for (const s of sheets) {
    const rev = await getRevision(actor, s.id, s.ordinal);
    const res = rev.results?.results as Record<string, unknown> | undefined;
    if (!res) continue;
    const base = { sheetId: s.id, tag: s.tag, title: s.title, kind: s.kind, label: s.label, status: s.status };
    if (s.kind === "busbar-rating") {
      const perMetre = num(res.loss_W_m);
      const arrangement = rev.inputs.arrangement as Record<string, unknown> | undefined;
      if (perMetre !== undefined) out.push({ ...base, lossPerMetre_W_m: perMetre, phases: num(arrangement?.phases) ?? 1 });
    } else {
      const loss = num(res.loss_W) ?? num(res.powerLoss_W) ?? num(res.totalLoss_W);
      if (loss !== undefined) out.push({ ...base, feederLoss_W: loss });
    }
  }
  return out;
}
