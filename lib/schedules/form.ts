/**
 * The upload form's fields besides the file, checked with the same schema in the browser
 * and on the server. Pure.
 */
import { z } from "zod";
import { choice, num } from "@/lib/engine/core/schema";
import { VOLTAGE_DROP_LIMIT_IDS } from "@/lib/engine/voltage-drop";

/** A positive whole-number id; numeric strings (form values) are accepted. */
const idField = (label: string) =>
  z.coerce
    .number({ error: `${label} must be a whole number from 1` })
    .refine((n) => Number.isInteger(n) && n >= 1 && n <= 4294967295, { message: `${label} must be a whole number from 1` });

const blankToUndefined = (v: unknown) => (v === null || v === undefined || (typeof v === "string" && v.trim() === "") ? undefined : v);

export const scheduleUploadSchema = z.object({
  projectId: idField("Project"),
  tableId: z.preprocess(blankToUndefined, idField("Ampacity table").optional()),
  limitId: choice("Voltage-drop limit", VOLTAGE_DROP_LIMIT_IDS).default("iec-a-other"),
  limitPercent: z.preprocess(blankToUndefined, num("Voltage-drop limit override", "%", 0, 50, { exclusiveMin: true }).optional()),
});
export type ScheduleUploadFields = z.input<typeof scheduleUploadSchema>;
