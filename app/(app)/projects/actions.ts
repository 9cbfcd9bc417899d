"use server";

import { revalidatePath } from "next/cache";
import { createProject, setProjectArchived, updateProject } from "@/db/queries/projects";
import { guardedAction } from "@/lib/auth/guard";
import { projectArchiveSchema, projectSchema, projectUpdateSchema } from "@/lib/validation/project";

// Each action: the guard (session, permission, the same zod schema as the form), then the
// plain function in db/queries/projects.ts that takes the Actor (tested on its own).

const create = guardedAction({ permission: "project.write", schema: projectSchema }, async (input, actor) => {
  const created = await createProject(actor, input);
  revalidatePath("/projects");
  return created;
});

const update = guardedAction({ permission: "project.write", schema: projectUpdateSchema }, async (input, actor) => {
  const saved = await updateProject(actor, input);
  revalidatePath("/projects");
  revalidatePath(`/projects/${input.id}`);
  return saved;
});

const setArchived = guardedAction({ permission: "project.archive", schema: projectArchiveSchema }, async (input, actor) => {
  const result = await setProjectArchived(actor, input.id, input.archived);
  revalidatePath("/projects");
  revalidatePath(`/projects/${input.id}`);
  return result;
});

export async function createProjectAction(raw: unknown) {
  return create(raw);
}

export async function updateProjectAction(raw: unknown) {
  return update(raw);
}

export async function setProjectArchivedAction(raw: unknown) {
  return setArchived(raw);
}
