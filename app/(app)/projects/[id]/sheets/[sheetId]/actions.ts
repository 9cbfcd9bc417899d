"use server";

import { z } from "zod";
import { getProject } from "@/db/queries/projects";
import { guardedAction } from "@/lib/auth/guard";
import { validationError } from "@/lib/errors";
import { idField } from "@/lib/sheets/schemas";
import { MAX_NETWORK_FILE_BYTES, parseNetworkFile, problemText } from "@/lib/sheets/network-import";
import { importNetwork, type RevisionRef } from "@/lib/sheets/service";

/** What the import form gets back. */
export type NetworkImportOutcome =
  | { imported: true; version: number; revision: RevisionRef; newRevision: boolean; counts: { nodes: number; segments: number; loads: number; supplies: number }; solveMs: number }
  | { imported: false; problems: string[]; more: number };

const formSchema = z.custom<FormData>((v) => v instanceof FormData, { message: "Network file: send the file as a form upload" });

const run = guardedAction({ permission: "sheet.write", schema: formSchema }, async (form, actor): Promise<NetworkImportOutcome> => {
  const ids = z.object({ projectId: idField("Project"), sheetId: idField("Sheet"), version: idField("Version") }).safeParse({
    projectId: form.get("projectId"),
    sheetId: form.get("sheetId"),
    version: form.get("version"),
  });
  if (!ids.success) throw validationError({ file: "The form is incomplete; reload the page" }, "The form is incomplete; reload the page");
  const file = form.get("file");
  if (!(file instanceof File) || file.size === 0) throw validationError({ file: "Network file: choose a .csv or .json file" }, "Network file: choose a .csv or .json file");
  if (file.size > MAX_NETWORK_FILE_BYTES) {
    const message = `The file is ${(file.size / 2 ** 20).toFixed(1)} MB; network files can be at most ${MAX_NETWORK_FILE_BYTES / 2 ** 20} MB.`;
    throw validationError({ file: message }, message);
  }
  // Settings a CSV file leaves out come from the project (404 for another organisation's).
  const project = await getProject(actor.organisationId, ids.data.projectId);
  const parsed = parseNetworkFile(file.name, new Uint8Array(await file.arrayBuffer()), {
    mode: project.systemType === "dc" ? "dc" : "ac",
    ...(project.frequency > 0 ? { frequency_Hz: project.frequency } : {}),
    ambient_C: Math.min(80, Math.max(-40, project.designAmbientC)),
  });
  if (!parsed.ok) return { imported: false, problems: parsed.problems.map(problemText), more: parsed.more };
  const r = await importNetwork(actor, {
    sheetId: ids.data.sheetId,
    version: ids.data.version,
    network: parsed.network as unknown as Record<string, unknown>,
    source: { fileName: (file.name || "network").slice(0, 200), format: parsed.format, bytes: file.size },
  });
  return { imported: true, version: r.version, revision: r.revision, newRevision: r.newRevision, counts: r.counts, solveMs: Math.round(r.solveMs) };
});

/**
 * Replaces a bus network sheet's network with an uploaded CSV or JSON file (engineer,
 * lead; the revision's author). The server reads the file, solves it and stores a draft
 * revision; a file with problems changes nothing and its problems come back by row.
 */
export async function importNetworkAction(form: FormData) {
  return run(form);
}
