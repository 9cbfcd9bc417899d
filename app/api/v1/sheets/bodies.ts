import { z } from "zod";
import { createSheetSchema, saveSheetSchema, transitionSheetSchema } from "@/lib/sheets/schemas";

/**
 * Request bodies of the sheet routes: the sheet functions' own schemas without the ids
 * that come from the URL. Shared by the handlers and the API document.
 */
export const createSheetBody = createSheetSchema.omit({ projectId: true });
export const saveSheetBody = saveSheetSchema.omit({ sheetId: true });
export const transitionBody = transitionSheetSchema.omit({ sheetId: true });

export type CreateSheetBody = z.output<typeof createSheetBody>;
