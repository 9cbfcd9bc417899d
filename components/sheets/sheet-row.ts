import type { SheetStatus } from "@/db/schema/sheets";
import type { SheetWithProject } from "@/db/queries/sheets";
import { sheetKindName } from "@/lib/sheets/kinds";

/** One sheet in a list, as pages and the JSON API send it (dates as ISO strings). */
export interface SheetRowJson {
  id: number;
  projectId: number;
  projectCode: string;
  projectName: string;
  kind: string;
  kindName: string;
  tag: string;
  title: string;
  label: string;
  status: SheetStatus;
  authorName: string;
  checkedByName: string | null;
  /** Label of the revision in force (newest approved), or null. */
  approvedLabel: string | null;
  submittedAt: string | null;
  updatedAt: string;
}

const iso = (d: Date | string | null) => (d === null ? null : typeof d === "string" ? d : d.toISOString());

export function toSheetRow(s: SheetWithProject): SheetRowJson {
  return {
    id: s.id,
    projectId: s.projectId,
    projectCode: s.projectCode,
    projectName: s.projectName,
    kind: s.kind,
    kindName: sheetKindName(s.kind),
    tag: s.tag,
    title: s.title,
    label: s.label,
    status: s.status,
    authorName: s.authorName,
    checkedByName: s.checkedByName,
    approvedLabel: s.approvedLabel,
    submittedAt: iso(s.submittedAt),
    updatedAt: iso(s.updatedAt) ?? "",
  };
}

export const sheetHref = (r: Pick<SheetRowJson, "projectId" | "id">) => `/projects/${r.projectId}/sheets/${r.id}`;
