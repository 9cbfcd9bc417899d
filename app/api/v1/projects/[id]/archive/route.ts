import { z } from "zod";
import { getProject, setProjectArchived } from "@/db/queries/projects";
import { guardedRoute, readJson } from "@/lib/auth/guard";
import { parseProjectId, projectJson } from "../../json";

export const dynamic = "force-dynamic";

const body = z.object({ archived: z.boolean({ error: () => "Archived must be true or false" }).default(true) });

/** POST { archived: true } archives, { archived: false } restores. */
export const POST = guardedRoute<{ id: string }>({ permission: "project.archive" }, async ({ req, actor, params }) => {
  const id = parseProjectId(params.id);
  const { archived } = await readJson(req, body);
  await setProjectArchived(actor, id, archived);
  return { project: projectJson(await getProject(actor.organisationId, id)) };
});
