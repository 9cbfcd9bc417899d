import "server-only";
import { notFound } from "next/navigation";
import { getProject, type ProjectDetail } from "@/db/queries/projects";
import type { Actor } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";

/** The project named in the URL, or the not-found page (also for another organisation's project). */
export async function loadProjectOr404(actor: Actor, rawId: string): Promise<ProjectDetail> {
  const id = /^\d{1,10}$/.test(rawId) ? Number(rawId) : NaN;
  if (!Number.isSafeInteger(id) || id < 1) notFound();
  try {
    return await getProject(actor.organisationId, id);
  } catch (err) {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  }
}
