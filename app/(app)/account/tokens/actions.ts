"use server";

import { revalidatePath } from "next/cache";
import { guardedAction } from "@/lib/auth/guard";
import { createToken, revokeToken } from "@/lib/auth/tokens";
import { createTokenSchema, revokeTokenSchema } from "./schema";

const PATH = "/account/tokens";

const create = guardedAction({ permission: "token.manage", schema: createTokenSchema }, async (input, actor) => {
  const t = await createToken(actor, input.name);
  revalidatePath(PATH);
  // The secret leaves the server this once; only its hash is stored.
  return { id: t.id, name: t.name, prefix: t.prefix, token: t.token };
});

const revoke = guardedAction({ permission: "token.manage", schema: revokeTokenSchema }, async (input, actor) => {
  const r = await revokeToken(actor, input.tokenId);
  revalidatePath(PATH);
  return { id: r.id, revokedAt: r.revokedAt.toISOString() };
});

export async function createTokenAction(raw: unknown) {
  return create(raw);
}

export async function revokeTokenAction(raw: unknown) {
  return revoke(raw);
}
