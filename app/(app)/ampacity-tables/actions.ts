"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { createAmpacityTableVersion, setAmpacityTableActive } from "@/db/queries/ampacity-tables";
import { guardedAction } from "@/lib/auth/guard";
import { ampacityMetaSchema, checkAmpacityFile } from "@/lib/ampacity/upload";
import type { CsvIssue } from "@/lib/engine/ampacity-table";
import { validationError } from "@/lib/errors";
import { fieldErrors, int } from "@/lib/engine/core/schema";

/** Rows of problems sent back at most; the count says how many there were. */
const MAX_LISTED = 500;

export type UploadOutcome =
  | { stored: true; id: number; name: string; version: number; rowCount: number; notes: string[] }
  | { stored: false; message: string; errors: CsvIssue[]; total: number };

const formSchema = z.custom<FormData>((v) => v instanceof FormData, { message: "Send the table as a form upload" });

const upload = guardedAction({ permission: "ampacity.manage", schema: formSchema }, async (form, actor): Promise<UploadOutcome> => {
  const meta = ampacityMetaSchema.safeParse({ name: form.get("name") ?? "", source: form.get("source") ?? "" });
  const file = form.get("file");
  const fields: Record<string, string> = meta.success ? {} : fieldErrors(meta.error);
  if (!(file instanceof File) || file.size === 0) fields.file = "CSV file: choose the table's CSV file";
  if (Object.keys(fields).length > 0 || !meta.success || !(file instanceof File)) throw validationError(fields);
  const filename = (file.name || "ampacity-table.csv").slice(0, 200);
  const data = Buffer.from(await file.arrayBuffer());
  const verdict = checkAmpacityFile(data, filename);
  if (!verdict.ok) {
    if (verdict.errors.length === 0) throw validationError({ file: verdict.message }, verdict.message);
    return { stored: false, message: verdict.message, errors: verdict.errors.slice(0, MAX_LISTED), total: verdict.errors.length };
  }
  const r = await createAmpacityTableVersion(actor, {
    name: meta.data.name,
    source: meta.data.source,
    rows: verdict.rows,
    file: { filename, contentType: "text/csv", data },
  });
  revalidatePath("/ampacity-tables");
  return { stored: true, id: r.id, name: r.name, version: r.version, rowCount: verdict.rows.length, notes: verdict.notes };
});

/**
 * Uploads an ampacity table (admins): name, source and the CSV. Under an existing name it
 * becomes the next version. A file with any bad row is refused whole, every problem listed.
 */
export async function uploadAmpacityTableAction(form: FormData) {
  return upload(form);
}

const idSchema = z.object({ id: int("Ampacity table", 1, 4_294_967_295) });

const retire = guardedAction({ permission: "ampacity.manage", schema: idSchema }, async ({ id }, actor) => {
  const r = await setAmpacityTableActive(actor, id, false);
  revalidatePath("/ampacity-tables");
  revalidatePath(`/ampacity-tables/${id}`);
  return r;
});

const restore = guardedAction({ permission: "ampacity.manage", schema: idSchema }, async ({ id }, actor) => {
  const r = await setAmpacityTableActive(actor, id, true);
  revalidatePath("/ampacity-tables");
  revalidatePath(`/ampacity-tables/${id}`);
  return r;
});

/** Retires one version: no longer offered for new sheets; sheets that used it keep their snapshot. */
export async function retireAmpacityTableAction(input: { id: number }) {
  return retire(input);
}

/** Offers a retired version again. */
export async function restoreAmpacityTableAction(input: { id: number }) {
  return restore(input);
}
