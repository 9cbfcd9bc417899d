import { guardedRoute } from "@/lib/auth/guard";
import { revokeToken } from "@/lib/auth/tokens";
import { parseRouteId } from "../../sheets/ids";
import { refuseBearer } from "../session-only";

export const dynamic = "force-dynamic";

/** DELETE /api/v1/tokens/{id}: revokes one of the signed-in user's tokens (another user's is a 404). Session only. */
export const DELETE = guardedRoute<{ id: string }>({ permission: "token.manage" }, async ({ req, actor, params }) => {
  refuseBearer(req);
  const { id, revokedAt } = await revokeToken(actor, parseRouteId(params.id, "Token"));
  return { revoked: true, id, revokedAt: revokedAt.toISOString() };
});
