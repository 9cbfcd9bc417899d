"use client";

import { useId, useState, useTransition } from "react";
import type { Role, UserStatus } from "@/db/schema";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { changeRoleAction, setUserStatusAction } from "./actions";
import { ROLE_OPTIONS } from "./role-options";

/** Role change and (de)activation for one row of the users table. */
export function UserControls({ user, isSelf }: { user: { id: number; name: string; role: Role; status: UserStatus }; isSelf: boolean }) {
  const [role, setRole] = useState<Role>(user.role);
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const selectId = useId();
  const errorId = `${selectId}-error`;

  const run = (action: () => Promise<{ ok: true } | { ok: false; error: { message: string } }>) => {
    setError(null);
    startTransition(async () => {
      const res = await action().catch(() => null);
      if (!res) setError("The server could not be reached. Try again.");
      else if (!res.ok) {
        setError(res.error.message);
        setRole(user.role);
      }
    });
  };

  const deactivate = () => {
    const who = isSelf ? "yourself" : user.name;
    if (!window.confirm(`Deactivate ${who}? ${isSelf ? "You" : "They"} will be signed out at the next request and cannot sign in until reactivated.`)) return;
    run(() => setUserStatusAction({ userId: user.id, status: "deactivated" }));
  };

  return (
    <div className="space-y-1">
      <div className="flex flex-wrap items-center gap-2">
        <label htmlFor={selectId} className="sr-only">
          Role of {user.name}
        </label>
        <select
          id={selectId}
          className="field-input mt-0 w-auto py-1.5"
          value={role}
          disabled={pending}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? errorId : undefined}
          onChange={(e) => setRole(e.target.value as Role)}
        >
          {ROLE_OPTIONS.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </select>
        {role !== user.role ? (
          <button type="button" className="btn-secondary py-1.5" disabled={pending} onClick={() => run(() => changeRoleAction({ userId: user.id, role }))}>
            Save role
          </button>
        ) : null}
        {user.status === "active" ? (
          <button type="button" className="btn-danger py-1.5" disabled={pending} onClick={deactivate}>
            Deactivate
          </button>
        ) : (
          <button type="button" className="btn-secondary py-1.5" disabled={pending} onClick={() => run(() => setUserStatusAction({ userId: user.id, status: "active" }))}>
            Reactivate
          </button>
        )}
      </div>
      {error ? (
        <p id={errorId} role="alert" className="field-error max-w-md">
          {error}
        </p>
      ) : null}
    </div>
  );
}
