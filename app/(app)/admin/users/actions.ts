"use server";

import { revalidatePath } from "next/cache";
import { changeUserRole, inviteUser, revokeInvitation, setUserStatus } from "@/db/queries/users";
import { guardedAction } from "@/lib/auth/guard";
import { forgetCachedBearers } from "@/lib/auth/tokens";
import { changeRoleSchema, inviteSchema, revokeSchema, setStatusSchema } from "./schema";

const PATH = "/admin/users";

const invite = guardedAction({ permission: "users.manage", schema: inviteSchema }, async (input, actor) => {
  const { expiresAt } = await inviteUser(actor, input);
  revalidatePath(PATH);
  return { email: input.email, expiresAt: expiresAt.toISOString() };
});

const changeRole = guardedAction({ permission: "users.manage", schema: changeRoleSchema }, async (input, actor) => {
  const r = await changeUserRole(actor, input.userId, input.role);
  // The API's token cache must not keep serving the old role.
  if (r.changed) forgetCachedBearers();
  revalidatePath(PATH);
  return r;
});

const setStatus = guardedAction({ permission: "users.manage", schema: setStatusSchema }, async (input, actor) => {
  const r = await setUserStatus(actor, input.userId, input.status);
  // A deactivated user's tokens are refused from the next request on.
  if (r.changed) forgetCachedBearers();
  revalidatePath(PATH);
  return r;
});

const revoke = guardedAction({ permission: "users.manage", schema: revokeSchema }, async (input, actor) => {
  await revokeInvitation(actor, input.invitationId);
  revalidatePath(PATH);
  return { revoked: true };
});

export async function inviteUserAction(raw: unknown) {
  return invite(raw);
}

export async function changeRoleAction(raw: unknown) {
  return changeRole(raw);
}

export async function setUserStatusAction(raw: unknown) {
  return setStatus(raw);
}

export async function revokeInvitationAction(raw: unknown) {
  return revoke(raw);
}
