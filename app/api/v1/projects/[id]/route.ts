import { z } from "zod";
import { getProject, updateProject } from "@/db/queries/projects";
import { guardedRoute, readJson } from "@/lib/auth/guard";
import { fieldErrors, int } from "@/lib/engine/core/schema";
import { validationError } from "@/lib/errors";
import { projectUpdateSchema, toProjectFormValues } from "@/lib/validation/project";
import { parseProjectId, projectJson } from "../json";

export const dynamic = "force-dynamic";

export const GET = guardedRoute<{ id: string }>({ permission: "project.read" }, async ({ actor, params }) => {
  return { project: projectJson(await getProject(actor.organisationId, parseProjectId(params.id))) };
});

const patchBody = z.looseObject({ version: int("Version", 1, 2 ** 32 - 1) });

/**
 * PATCH: any subset of the project fields plus the `version` the client last read.
 * Fields left out keep their values (converted when only the unit system changes);
 * a stale version is a 409 and nothing is written.
 */
export const PATCH = guardedRoute<{ id: string }>({ permission: "project.write" }, async ({ req, actor, params }) => {
  const id = parseProjectId(params.id);
  const body = await readJson(req, patchBody);
  const current = await getProject(actor.organisationId, id);
  const unitSystem = body.unitSystem === "metric" || body.unitSystem === "imperial" ? body.unitSystem : current.unitSystem;
  const merged = { ...toProjectFormValues({ ...current, unitSystem }), ...body, id, version: body.version };
  const parsed = projectUpdateSchema.safeParse(merged);
  if (!parsed.success) throw validationError(fieldErrors(parsed.error));
  await updateProject(actor, parsed.data);
  return { project: projectJson(await getProject(actor.organisationId, id)) };
});
