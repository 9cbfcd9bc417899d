import { createProject, getProject, listProjects } from "@/db/queries/projects";
import { guardedRoute, readJson } from "@/lib/auth/guard";
import { fieldErrors } from "@/lib/engine/core/schema";
import { validationError } from "@/lib/errors";
import { projectListQuerySchema, projectSchema } from "@/lib/validation/project";
import { projectJson } from "./json";

export const dynamic = "force-dynamic";

/** GET /api/v1/projects?q=&sort=code|name|client|updated&dir=asc|desc&archived=0|1 */
export const GET = guardedRoute({ permission: "project.read" }, async ({ req, actor }) => {
  const params = Object.fromEntries(new URL(req.url).searchParams);
  const parsed = projectListQuerySchema.safeParse(params);
  if (!parsed.success) throw validationError(fieldErrors(parsed.error));
  return { projects: await listProjects(actor.organisationId, parsed.data) };
});

/** POST /api/v1/projects: the project form's fields; design ambient and altitude in the project's unit system. */
export const POST = guardedRoute({ permission: "project.write" }, async ({ req, actor }) => {
  const input = await readJson(req, projectSchema);
  const { id } = await createProject(actor, input);
  return Response.json({ project: projectJson(await getProject(actor.organisationId, id)) }, { status: 201 });
});
