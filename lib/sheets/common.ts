import type { z } from "zod";
import type { Actor } from "@/lib/auth/guard";
import { can, type Permission } from "@/lib/auth/roles";
import { fieldErrors } from "@/lib/engine/core/field-errors";
import { forbidden, validationError } from "@/lib/errors";

/** Shown when the version a client opened is no longer the sheet's version (409). */
export const STALE_SHEET_MESSAGE = "Someone else saved this sheet since you opened it; reload to see their changes";
/** 404 message for a sheet that does not exist in the actor's organisation. */
export const SHEET_NOT_FOUND = "Sheet not found";
/** 404 message for a project that does not exist in the actor's organisation. */
export const PROJECT_NOT_FOUND = "Project not found";

/** Throws 403 unless the actor's role has the permission. */
export function requirePermission(actor: Actor, permission: Permission): void {
  if (!can(actor.role, permission)) throw forbidden();
}

/** Parses with a schema; field errors become a 400 naming each field. */
export function parseInput<S extends z.ZodType>(schema: S, raw: unknown): z.output<S> {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw validationError(fieldErrors(parsed.error));
  return parsed.data;
}
