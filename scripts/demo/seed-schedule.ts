// Seeds the demo project's cable schedule (scripts/demo/cable-schedule.csv: invented feeders
// of the demo scenario) through the same pure computation the upload uses, with its file,
// hash and audit event, inside the seed's transaction.
import { readFileSync } from "node:fs";
import { createHash } from "node:crypto";
import type { Tx } from "../../db/client";
import { cableSchedules, uploads } from "../../db/schema";
import { audit } from "../../lib/audit";
import { ENGINE_VERSION } from "../../lib/engine/core/result";
import { scheduleResultsHash } from "../../lib/schedules/hash";
import { processSchedule } from "../../lib/schedules/schedule";
import type { ScheduleOptions } from "../../lib/schedules/types";

export async function seedDemoSchedule(
  tx: Tx,
  ids: { organisationId: number; projectId: number; userId: number },
  project: { designAmbient: number; frequency: number },
): Promise<{ id: number; rowCount: number; failCount: number }> {
  const filename = "cable-schedule.csv";
  const data = readFileSync(new URL("./cable-schedule.csv", import.meta.url));
  const options: ScheduleOptions = { limitId: "iec-a-other", defaultAmbient_C: project.designAmbient, frequency_Hz: project.frequency > 0 ? project.frequency : 50 };
  const computed = processSchedule({ bytes: new Uint8Array(data.buffer, data.byteOffset, data.byteLength), options, table: null, tableLabel: null });
  if (computed.errors.length) throw new Error(`demo cable schedule: ${computed.errors.length} row errors, first: ${JSON.stringify(computed.errors[0])}`);
  const stored = { ...options, method: "exact", temperatureBasis: "at the load current", notices: computed.notices, table: null };
  const sha256 = createHash("sha256").update(data).digest("hex");
  const [up] = await tx
    .insert(uploads)
    .values({ organisationId: ids.organisationId, kind: "cable-schedule", filename, contentType: "text/csv", sizeBytes: data.length, sha256, data, createdById: ids.userId })
    .$returningId();
  if (!up) throw new Error("demo cable schedule: no upload id");
  const [row] = await tx
    .insert(cableSchedules)
    .values({
      organisationId: ids.organisationId,
      projectId: ids.projectId,
      uploadId: up.id,
      filename,
      fileSha256: sha256,
      ampacityTableId: null,
      options: stored,
      rowCount: computed.rowCount,
      validCount: computed.validCount,
      failCount: computed.failCount,
      results: computed.results as unknown as Record<string, unknown>[],
      errors: [],
      engineVersion: ENGINE_VERSION,
      resultsHash: scheduleResultsHash(ENGINE_VERSION, stored, computed.results),
      createdById: ids.userId,
    })
    .$returningId();
  if (!row) throw new Error("demo cable schedule: no id");
  await audit(tx, {
    organisationId: ids.organisationId,
    actorId: ids.userId,
    event: "schedule.uploaded",
    entityType: "project",
    entityId: ids.projectId,
    details: { scheduleId: row.id, uploadId: up.id, filename, sha256, sizeBytes: data.length, rows: computed.rowCount, valid: computed.validCount, failing: computed.failCount, seeded: true },
  });
  return { id: row.id, rowCount: computed.rowCount, failCount: computed.failCount };
}
