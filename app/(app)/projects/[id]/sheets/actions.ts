"use server";

import { z } from "zod";
import { guardedAction } from "@/lib/auth/guard";
import { createSheetSchema, saveSheetSchema, transitionSheetSchema } from "@/lib/sheets/schemas";
import { createSheet, saveSheet, transitionSheet, type RevisionRef } from "@/lib/sheets/service";

/**
 * Server actions of the sheet pages. Each is guarded (session, role, zod input) and
 * hands the validated input to the sheet service, which re-checks the rules that depend
 * on the row (organisation, author, status, version) inside its transaction.
 */

/** What the editor needs back from a write (the results themselves are re-read with the page). */
export interface SheetWriteOutcome {
  sheetId: number;
  projectId: number;
  version: number;
  revision: RevisionRef;
  newRevision: boolean;
  inputErrors: Record<string, string> | null;
}

/** Adds a sheet to a project (engineer, lead). */
export const createSheetAction = guardedAction({ permission: "sheet.write", schema: createSheetSchema }, async (input, actor): Promise<SheetWriteOutcome> => {
  const r = await createSheet(actor, input);
  return { sheetId: r.sheetId, projectId: r.projectId, version: r.version, revision: r.revision, newRevision: r.newRevision, inputErrors: r.inputErrors };
});

/** Saves inputs against the version the editor opened; 409 when someone saved first (engineer, lead). */
export const saveSheetAction = guardedAction({ permission: "sheet.write", schema: saveSheetSchema }, async (input, actor): Promise<SheetWriteOutcome> => {
  const r = await saveSheet(actor, input);
  return { sheetId: r.sheetId, projectId: r.projectId, version: r.version, revision: r.revision, newRevision: r.newRevision, inputErrors: r.inputErrors };
});

/** Submit for review or withdraw from review (engineer, lead; withdraw by the author only). */
export const submitSheetAction = guardedAction(
  { permission: "sheet.submit", schema: transitionSheetSchema.extend({ transition: z.enum(["submit", "withdraw"], { error: "Transition must be submit or withdraw" }) }) },
  async (input, actor) => {
    const r = await transitionSheet(actor, input);
    return { version: r.version, revision: r.revision, notified: r.notified.length };
  },
);

/** Approve, or return with a comment (a lead who is not the revision's author). */
export const reviewSheetAction = guardedAction(
  { permission: "sheet.review", schema: transitionSheetSchema.extend({ transition: z.enum(["approve", "return"], { error: "Transition must be approve or return" }) }) },
  async (input, actor) => {
    const r = await transitionSheet(actor, input);
    return { version: r.version, revision: r.revision, superseded: r.superseded };
  },
);
