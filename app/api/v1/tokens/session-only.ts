import { forbidden } from "@/lib/errors";
import type { TokenListItem } from "@/lib/auth/tokens";

/**
 * Tokens are managed from a signed-in session only: a leaked token must not be able to
 * mint more tokens or hide itself by revoking others.
 */
export function refuseBearer(req: Request): void {
  if (/^bearer /i.test(req.headers.get("authorization") ?? "")) throw forbidden("API tokens cannot manage API tokens; sign in to Ohmstead to do this");
}

export function tokenJson(t: TokenListItem) {
  return {
    id: t.id,
    name: t.name,
    prefix: t.prefix,
    createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
    revokedAt: t.revokedAt?.toISOString() ?? null,
  };
}
