import { z } from "zod";
import { findUpload, packageBelongsToProject } from "@/db/queries/uploads";
import { guardedRoute } from "@/lib/auth/guard";
import { notFound, validationError } from "@/lib/errors";
import { fieldErrors } from "@/lib/engine/core/schema";
import { issuePackage } from "@/lib/pdf/package";
import { pdfResponse } from "@/lib/pdf/render";
import { parseInput } from "@/lib/sheets/common";
import { idField } from "@/lib/sheets/schemas";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const issueSchema = z.object({ includeDrafts: z.boolean({ error: "Include drafts must be true or false" }).default(false) });

/**
 * POST /api/v1/projects/:id/package — issues the calculation package (project.write).
 * JSON body { includeDrafts?: boolean } → 201 with the stored file's id and SHA-256.
 * A form post from the project page (checkbox includeDrafts=on) is answered with a
 * redirect back to the project's package panel.
 */
export const POST = guardedRoute<{ id: string }>({ permission: "project.write" }, async ({ req, actor, params }) => {
  const type = req.headers.get("content-type") ?? "";
  const isForm = type.includes("application/x-www-form-urlencoded") || type.includes("multipart/form-data");
  let includeDrafts = false;
  if (isForm) {
    includeDrafts = (await req.formData()).get("includeDrafts") === "on";
  } else {
    const text = await req.text();
    let raw: unknown = {};
    try {
      raw = text.trim() ? JSON.parse(text) : {};
    } catch {
      throw validationError({ _: "The request body must be JSON" }, "The request body must be JSON");
    }
    const parsed = issueSchema.safeParse(raw);
    if (!parsed.success) throw validationError(fieldErrors(parsed.error));
    includeDrafts = parsed.data.includeDrafts;
  }
  const issued = await issuePackage(actor, params.id, { includeDrafts });
  // A relative Location (RFC 9110 §10.2.2): the browser stays on the host it used, with its session cookie.
  if (isForm) return new Response(null, { status: 303, headers: { location: `/projects/${params.id}?package=${issued.uploadId}#packages` } });
  return Response.json(issued, { status: 201 });
});

/** GET /api/v1/projects/:id/package?upload=<id> — an issued package, byte for byte as issued (project.read). */
export const GET = guardedRoute<{ id: string }>({ permission: "project.read" }, async ({ req, actor, params }) => {
  const projectId = parseInput(idField("Project"), params.id);
  const uploadId = parseInput(idField("Upload"), new URL(req.url).searchParams.get("upload") ?? "");
  if (!(await packageBelongsToProject(actor.organisationId, projectId, uploadId))) throw notFound("Package not found");
  const file = await findUpload(actor.organisationId, uploadId, "package");
  const res = pdfResponse(file.data, file.filename);
  res.headers.set("x-content-sha256", file.sha256);
  return res;
});
