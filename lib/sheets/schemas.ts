import { z } from "zod";
import { CALC_KIND_NAMES, isCalcKind } from "@/lib/engine";
import { TRANSITION_NAMES, type TransitionName } from "./workflow";

/**
 * Input schemas of the sheet functions: the same on the client (forms) and the server.
 * Every message names the field and what is allowed.
 */

/** Largest accepted inputs document (serialised JSON), bytes. */
export const MAX_INPUTS_BYTES = 256 * 1024;

/** A positive whole-number id; numeric strings (route params, form values) are accepted. */
export const idField = (label: string) =>
  z.coerce
    .number({ error: `${label} must be a whole number from 1` })
    .refine((n) => Number.isInteger(n) && n >= 1 && n <= 4294967295, { message: `${label} must be a whole number from 1` });

/** A revision ordinal: 0, 1, 2 … */
export const ordinalField = (label: string) =>
  z.coerce
    .number({ error: `${label} must be a whole number from 0` })
    .refine((n) => Number.isInteger(n) && n >= 0 && n <= 100000, { message: `${label} must be a whole number from 0 to 100000` });

function jsonSize(v: unknown): number | null {
  try {
    const s = JSON.stringify(v);
    return s === undefined ? null : Buffer.byteLength(s, "utf8");
  } catch {
    return null;
  }
}

/**
 * The inputs of a sheet: any JSON object (the calculation kind's own schema decides
 * whether it is valid; an invalid draft is still stored so nothing typed is lost).
 */
export const sheetInputsSchema = z
  .record(z.string(), z.unknown(), { error: "Inputs must be an object of field values" })
  .superRefine((v, ctx) => {
    const size = jsonSize(v);
    if (size === null) ctx.addIssue({ code: "custom", message: "Inputs must be plain JSON values" });
    else if (size > MAX_INPUTS_BYTES) ctx.addIssue({ code: "custom", message: `Inputs must be at most ${MAX_INPUTS_BYTES / 1024} KB of JSON (got ${Math.ceil(size / 1024)} KB)` });
  });

/** Sheet tag, unique in its project (e.g. "BB-01", "MCC-2/EH"). */
export const sheetTagField = z
  .string({ error: "Tag is required (1 to 40 characters)" })
  .trim()
  .min(1, "Tag is required (1 to 40 characters)")
  .max(40, "Tag must be at most 40 characters")
  .regex(/^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/, "Tag must start with a letter or digit and use only letters, digits, spaces and . _ / -");

/** Sheet title. */
export const sheetTitleField = z
  .string({ error: "Title is required (1 to 200 characters)" })
  .trim()
  .min(1, "Title is required (1 to 200 characters)")
  .max(200, "Title must be at most 200 characters");

/** Calculation kind: one of the engine's kinds. */
export const calcKindField = z
  .string({ error: `Kind must be one of: ${CALC_KIND_NAMES.join(", ")}` })
  .refine((k) => isCalcKind(k), { message: `Kind must be one of: ${CALC_KIND_NAMES.join(", ")}` });

/** The sheet version a client opened (optimistic locking). */
export const versionField = z.coerce
  .number({ error: "Version must be a whole number from 1" })
  .refine((n) => Number.isInteger(n) && n >= 1, { message: "Version must be a whole number from 1" });

/** Input of `createSheet`. */
export const createSheetSchema = z.object({
  projectId: idField("Project"),
  kind: calcKindField,
  tag: sheetTagField,
  title: sheetTitleField,
  inputs: sheetInputsSchema.default({}),
});
/** What a client sends to `createSheet`. */
export type CreateSheetInput = z.input<typeof createSheetSchema>;

/** Input of `saveSheet`. */
export const saveSheetSchema = z.object({
  sheetId: idField("Sheet"),
  version: versionField,
  inputs: sheetInputsSchema,
  title: sheetTitleField.optional(),
});
/** What a client sends to `saveSheet`. */
export type SaveSheetInput = z.input<typeof saveSheetSchema>;

/** Longest review comment, characters. */
export const MAX_COMMENT_CHARS = 4000;

/** Input of `transitionSheet`. */
export const transitionSheetSchema = z.object({
  sheetId: idField("Sheet"),
  version: versionField,
  transition: z.enum(TRANSITION_NAMES as [TransitionName, ...TransitionName[]], { error: `Transition must be one of: ${TRANSITION_NAMES.join(", ")}` }),
  comment: z
    .string({ error: "Comment must be text" })
    .trim()
    .max(MAX_COMMENT_CHARS, `Comment must be at most ${MAX_COMMENT_CHARS} characters`)
    .nullish()
    .transform((c) => (c ? c : null)),
});
/** What a client sends to `transitionSheet`. */
export type TransitionSheetInput = z.input<typeof transitionSheetSchema>;

/** Input of `diffRevisions`. */
export const diffRevisionsSchema = z.object({
  sheetId: idField("Sheet"),
  fromOrdinal: ordinalField("From revision"),
  toOrdinal: ordinalField("To revision"),
});

