"use client";

import { useRouter } from "next/navigation";
import { ConfirmActionButton } from "@/components/forms/confirm-action-button";
import { restoreAmpacityTableAction, retireAmpacityTableAction } from "../actions";

/** The admin's retire or restore button for one version. */
export function RetireRestore({ id, active, label }: { id: number; active: boolean; label: string }) {
  const router = useRouter();
  const run = (fn: typeof retireAmpacityTableAction) => async () => {
    const r = await fn({ id });
    if (r.ok) router.refresh();
    return r;
  };
  return active ? (
    <ConfirmActionButton
      confirm={`Retire ${label}? It will no longer be offered for new sheets; sheets that used it keep their copy of its rows.`}
      run={run(retireAmpacityTableAction)}
      label="Retire"
      pendingLabel="Retiring…"
      ariaLabel={`Retire ${label}`}
      className="btn-danger"
    />
  ) : (
    <ConfirmActionButton confirm={`Restore ${label}? It will be offered for new sheets again.`} run={run(restoreAmpacityTableAction)} label="Restore" pendingLabel="Restoring…" ariaLabel={`Restore ${label}`} className="btn-secondary" />
  );
}
