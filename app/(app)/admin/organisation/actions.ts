"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { setOrganisationLogo } from "@/db/queries/uploads";
import { guardedAction } from "@/lib/auth/guard";
import { validationError } from "@/lib/errors";
import { checkLogo } from "@/lib/pdf/logo-image";

const formSchema = z.custom<FormData>((v) => v instanceof FormData, { message: "Logo: send the file as a form upload" });

const upload = guardedAction({ permission: "organisation.manage", schema: formSchema }, async (form, actor) => {
  const file = form.get("logo");
  if (!(file instanceof File) || file.size === 0) throw validationError({ logo: "Logo: choose a PNG or JPEG file" });
  const data = Buffer.from(await file.arrayBuffer());
  const check = checkLogo(data);
  if (!check.ok) throw validationError({ logo: check.message }, check.message);
  const filename = (file.name || `logo.${check.format}`).slice(0, 200);
  const r = await setOrganisationLogo(actor, { filename, contentType: check.contentType, data, width: check.width, height: check.height });
  revalidatePath("/admin/organisation");
  return { uploadId: r.uploadId, width: check.width, height: check.height, contentType: check.contentType };
});

/** Uploads the organisation's logo (admins): PNG or JPEG by content, ≤ 1 MB, ≤ 2000 × 2000 px. */
export async function uploadLogoAction(form: FormData) {
  return upload(form);
}
