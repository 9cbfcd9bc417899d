import "server-only";
import { getAmpacityTable, listAmpacityTables } from "@/db/queries/ampacity-tables";
import { getProject } from "@/db/queries/projects";
import { insertSchedule } from "@/db/queries/schedules";
import type { Actor } from "@/lib/auth/guard";
import { ENGINE_VERSION } from "@/lib/engine/core/result";
import { conflict, validationError } from "@/lib/errors";
import { parseInput, requirePermission } from "@/lib/sheets/common";
import { formatMegabytes } from "./decode";
import { scheduleResultsHash } from "./hash";
import { scheduleUploadSchema } from "./form";
import { processSchedule, ScheduleFileError } from "./schedule";
import { MAX_FILE_BYTES, MAX_FILE_LABEL, type ScheduleOptions, type ScheduleTableRef } from "./types";

/**
 * The upload of a cable schedule: checks the user, the project and the chosen table,
 * reads and computes the file (lib/schedules, pure), then stores the file, the schedule
 * and its audit event in one transaction (db/queries/schedules.ts). The only module of
 * lib/schedules that touches the database.
 */

export interface ScheduleUploadFile {
  name: string;
  type: string;
  data: Buffer;
}

export interface ScheduleUploadResult {
  id: number;
  uploadId: number;
  sha256: string;
  rowCount: number;
  validCount: number;
  failCount: number;
  errorCount: number;
}

const safeFilename = (name: string) => (name.replace(/[\\/\u0000-\u001f]+/g, "_").trim() || "cable-schedule.csv").slice(0, 200);

export async function uploadSchedule(actor: Actor, fields: unknown, file: ScheduleUploadFile | null): Promise<ScheduleUploadResult> {
  requirePermission(actor, "schedule.upload");
  const input = parseInput(scheduleUploadSchema, fields);
  const project = await getProject(actor.organisationId, input.projectId);
  if (project.archivedAt) throw conflict("The project is archived: restore it before uploading a cable schedule");
  if (!file || file.data.length === 0) throw validationError({ file: "Cable schedule file: choose a CSV file (it is empty or missing)" });
  if (file.data.length > MAX_FILE_BYTES)
    throw validationError({ file: `The file is ${formatMegabytes(file.data.length)}; the limit is ${MAX_FILE_LABEL}. Split the schedule into smaller files.` });

  let tableRef: ScheduleTableRef | null = null;
  let rows = null;
  if (input.tableId !== undefined) {
    const [t, active] = await Promise.all([getAmpacityTable(actor.organisationId, input.tableId), listAmpacityTables(actor.organisationId, { activeOnly: true })]);
    if (!t) throw validationError({ tableId: "Ampacity table: that table does not exist in your organisation; choose one from the list" });
    if (!active.some((a) => a.id === t.id)) throw validationError({ tableId: `Ampacity table: ${t.name} v${t.version} is retired; choose an active table` });
    tableRef = { id: t.id, name: t.name, version: t.version, source: t.source };
    rows = t.rows;
  }

  const options: ScheduleOptions = {
    limitId: input.limitId,
    ...(input.limitPercent !== undefined ? { limitPercent: input.limitPercent } : {}),
    defaultAmbient_C: project.designAmbientC,
    frequency_Hz: project.frequency > 0 ? project.frequency : 50,
  };
  let computed;
  try {
    computed = processSchedule({
      bytes: new Uint8Array(file.data.buffer, file.data.byteOffset, file.data.byteLength),
      options,
      table: tableRef && rows ? { name: tableRef.name, source: tableRef.source, rows } : null,
      tableLabel: tableRef ? `"${tableRef.name}" v${tableRef.version}` : null,
    });
  } catch (err) {
    if (err instanceof ScheduleFileError) throw validationError({ file: err.message }, err.message);
    throw err;
  }
  const stored = { ...options, method: "exact", temperatureBasis: "at the load current", notices: computed.notices, table: tableRef };
  const resultsHash = scheduleResultsHash(ENGINE_VERSION, stored, computed.results);
  const filename = safeFilename(file.name);
  const saved = await insertSchedule(actor, {
    projectId: project.id,
    filename,
    contentType: "text/csv",
    data: file.data,
    ampacityTableId: tableRef?.id ?? null,
    options: stored,
    rowCount: computed.rowCount,
    validCount: computed.validCount,
    failCount: computed.failCount,
    results: computed.results,
    errors: computed.errors,
    engineVersion: ENGINE_VERSION,
    resultsHash,
  });
  return { id: saved.id, uploadId: saved.uploadId, sha256: saved.sha256, rowCount: computed.rowCount, validCount: computed.validCount, failCount: computed.failCount, errorCount: computed.errors.length };
}
