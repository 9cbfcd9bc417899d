"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { guardedAction } from "@/lib/auth/guard";
import { validationError } from "@/lib/errors";
import { formatMegabytes } from "@/lib/schedules/decode";
import { uploadSchedule } from "@/lib/schedules/service";
import { MAX_FILE_BYTES, MAX_FILE_LABEL } from "@/lib/schedules/types";

const formSchema = z.custom<FormData>((v) => v instanceof FormData, { message: "Cable schedule: send the file as a form upload" });

const field = (form: FormData, name: string) => {
  const v = form.get(name);
  return typeof v === "string" ? v : undefined;
};

const upload = guardedAction({ permission: "schedule.upload", schema: formSchema }, async (form, actor) => {
  const file = form.get("file");
  if (!(file instanceof File) || file.size === 0) throw validationError({ file: "Cable schedule file: choose a CSV file (it is empty or missing)" });
  // Refused before the bytes are read into memory.
  if (file.size > MAX_FILE_BYTES) throw validationError({ file: `The file is ${formatMegabytes(file.size)}; the limit is ${MAX_FILE_LABEL}. Split the schedule into smaller files.` });
  const fields = { projectId: field(form, "projectId"), tableId: field(form, "tableId"), limitId: field(form, "limitId"), limitPercent: field(form, "limitPercent") };
  const r = await uploadSchedule(actor, fields, { name: file.name, type: file.type, data: Buffer.from(await file.arrayBuffer()) });
  revalidatePath(`/projects/${fields.projectId}/schedule`);
  revalidatePath(`/projects/${fields.projectId}`);
  return r;
});

/** Uploads a cable schedule CSV to a project (lead, engineer): at most 10 MB and 20 000 rows. */
export async function uploadScheduleAction(form: FormData) {
  return upload(form);
}
