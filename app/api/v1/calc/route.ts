// Installs the bearer-token resolver in this route's module graph (idempotent).
import "@/lib/auth/tokens";
import { guardedRoute } from "@/lib/auth/guard";
import { CALC_KINDS, ENGINE_VERSION } from "@/lib/engine";

export const dynamic = "force-dynamic";

/** GET /api/v1/calc: the calculation kinds with their titles and where to post inputs. */
export const GET = guardedRoute({ permission: "sheet.read" }, async () => ({
  engineVersion: ENGINE_VERSION,
  kinds: Object.values(CALC_KINDS).map((k) => ({ kind: k.kind, title: k.title, href: `/api/v1/calc/${k.kind}` })),
}));
