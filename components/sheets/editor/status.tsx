import type { SheetStatus } from "@/db/schema/sheets";
import { StatusBadge, type BadgeTone } from "@/components/ui/status-badge";

export const STATUS_LABELS: Record<SheetStatus, string> = {
  draft: "Draft",
  in_review: "In review",
  returned: "Returned",
  approved: "Approved",
  superseded: "Superseded",
};

const TONES: Record<SheetStatus, BadgeTone> = {
  draft: "neutral",
  in_review: "active",
  returned: "warning",
  approved: "pass",
  superseded: "archived",
};

/** A sheet revision's review state. */
export function SheetStatusBadge({ status }: { status: SheetStatus }) {
  return (
    <span data-status={status}>
      <StatusBadge tone={TONES[status]}>{STATUS_LABELS[status]}</StatusBadge>
    </span>
  );
}
