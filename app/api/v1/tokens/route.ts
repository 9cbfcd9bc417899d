import { guardedRoute, readJson } from "@/lib/auth/guard";
import { createToken, listTokens } from "@/lib/auth/tokens";
import { notFound } from "@/lib/errors";
import { tokenCreateBody } from "./body";
import { refuseBearer, tokenJson } from "./session-only";

export const dynamic = "force-dynamic";

/** GET /api/v1/tokens: the signed-in user's tokens, newest first (revoked ones marked). Session only. */
export const GET = guardedRoute({ permission: "token.manage" }, async ({ req, actor }) => {
  refuseBearer(req);
  return { tokens: (await listTokens(actor)).map(tokenJson) };
});

/** POST /api/v1/tokens { name }: a new token; its secret is in this response only. Session only. */
export const POST = guardedRoute({ permission: "token.manage" }, async ({ req, actor }) => {
  refuseBearer(req);
  const { name } = await readJson(req, tokenCreateBody);
  const created = await createToken(actor, name);
  const row = (await listTokens(actor)).find((t) => t.id === created.id);
  if (!row) throw notFound("Token not found");
  return Response.json({ token: tokenJson(row), secret: created.token }, { status: 201, headers: { "cache-control": "no-store" } });
});
