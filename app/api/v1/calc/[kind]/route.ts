// Installs the bearer-token resolver in this route's module graph (idempotent).
import "@/lib/auth/tokens";
import { guardedRoute } from "@/lib/auth/guard";
import { CALC_KIND_NAMES, CALC_KINDS, isCalcKind, runCalc } from "@/lib/engine";
import { notFound, validationError } from "@/lib/errors";
import { readRawJson } from "../body";
import { calcInputJsonSchema } from "../json-schema";

export const dynamic = "force-dynamic";

function kindOf(raw: string | undefined) {
  const kind = raw ?? "";
  if (!isCalcKind(kind)) throw notFound(`Unknown calculation kind; known kinds: ${CALC_KIND_NAMES.join(", ")}`);
  return kind;
}

/**
 * POST /api/v1/calc/{kind}: runs one calculation on the JSON body and returns its
 * CalcResult. Nothing is stored. Bad input is a 400 whose `fields` name each field.
 */
export const POST = guardedRoute<{ kind: string }>({ permission: "sheet.read" }, async ({ req, params }) => {
  const kind = kindOf(params.kind);
  const out = runCalc(kind, await readRawJson(req));
  if (!out.ok) throw validationError(out.fields);
  return out.result;
});

/** GET /api/v1/calc/{kind}: the kind's title and the JSON Schema of its request body. */
export const GET = guardedRoute<{ kind: string }>({ permission: "sheet.read" }, async ({ params }) => {
  const kind = kindOf(params.kind);
  return { kind, title: CALC_KINDS[kind].title, href: `/api/v1/calc/${kind}`, inputSchema: calcInputJsonSchema(kind) };
});
