import "server-only";
import { notFound } from "next/navigation";
import { getProject, type ProjectDetail } from "@/db/queries/projects";
import type { Actor } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { getSheet, type SheetDetail } from "@/lib/sheets/service";

/** Turns the service's 400/404 for an id in the URL into the not-found page. */
export async function or404<T>(p: Promise<T>): Promise<T> {
  try {
    return await p;
  } catch (err) {
    if (err instanceof AppError && (err.code === "not_found" || err.code === "validation")) notFound();
    throw err;
  }
}

/** The sheet named in the URL with its project; not found unless both belong to the actor's organisation and to each other. */
export async function loadSheetOr404(actor: Actor, projectIdRaw: string, sheetIdRaw: string): Promise<{ sheet: SheetDetail; project: ProjectDetail }> {
  if (!/^\d{1,10}$/.test(projectIdRaw) || !/^\d{1,10}$/.test(sheetIdRaw)) notFound();
  const sheet = await or404(getSheet(actor, sheetIdRaw));
  if (sheet.projectId !== Number(projectIdRaw)) notFound();
  const project = await or404(getProject(actor.organisationId, sheet.projectId));
  return { sheet, project };
}
