"use server";

import { acceptInvitation } from "@/db/queries/users";
import type { ActionResult } from "@/lib/auth/guard";
import { fieldErrors } from "@/lib/engine/core/schema";
import { errorBody, toAppError, validationError } from "@/lib/errors";
import { acceptSchema } from "./schema";

/**
 * Public by nature: the person has no account yet, and the single-use invitation token
 * (32 random bytes, stored only as its SHA-256) is the credential. Hence no guardedAction:
 * the input is validated here with the form's schema and errors use the same vocabulary.
 */
export async function acceptInviteAction(raw: unknown): Promise<ActionResult<{ email: string }>> {
  try {
    const parsed = acceptSchema.safeParse(raw);
    if (!parsed.success) throw validationError(fieldErrors(parsed.error));
    const { token, name, password } = parsed.data;
    const joined = await acceptInvitation({ token, name, password });
    return { ok: true, data: { email: joined.email } };
  } catch (err) {
    return { ok: false, error: errorBody(toAppError(err)).error };
  }
}
