// Seeds the demo organisation's ampacity table (scripts/demo/ampacity-table.csv) as
// version 1, with its file and audit event, inside the seed's transaction. The values are
// illustrative demo values (a smooth invented curve), not a code's table; the source says so.
import { readFileSync } from "node:fs";
import { createHash } from "node:crypto";
import type { Tx } from "../../db/client";
import { ampacityTables, uploads } from "../../db/schema";
import { audit } from "../../lib/audit";
import { checkAmpacityFile, formatCsvIssue } from "../../lib/ampacity/upload";

export const DEMO_AMPACITY_TABLE_NAME = "Demo cable ampacities";
export const DEMO_AMPACITY_TABLE_SOURCE = "Illustrative demo values invented for Ohmstead's demo organisation (not a code's table): do not use for design.";

export async function seedDemoAmpacityTable(tx: Tx, organisationId: number, adminUserId: number): Promise<{ id: number; rowCount: number }> {
  const filename = "ampacity-table.csv";
  const data = readFileSync(new URL("./ampacity-table.csv", import.meta.url));
  const verdict = checkAmpacityFile(data, filename);
  if (!verdict.ok) throw new Error(`demo ampacity table: ${verdict.message} ${verdict.errors.map(formatCsvIssue).join("; ")}`);
  const sha256 = createHash("sha256").update(data).digest("hex");
  const [up] = await tx
    .insert(uploads)
    .values({ organisationId, kind: "ampacity-table", filename, contentType: "text/csv", sizeBytes: data.length, sha256, data, createdById: adminUserId })
    .$returningId();
  if (!up) throw new Error("demo ampacity table: no upload id");
  const [row] = await tx
    .insert(ampacityTables)
    .values({
      organisationId,
      name: DEMO_AMPACITY_TABLE_NAME,
      version: 1,
      source: DEMO_AMPACITY_TABLE_SOURCE,
      rows: verdict.rows as unknown as Record<string, unknown>[],
      rowCount: verdict.rows.length,
      uploadId: up.id,
      fileSha256: sha256,
      createdById: adminUserId,
    })
    .$returningId();
  if (!row) throw new Error("demo ampacity table: no id");
  await audit(tx, {
    organisationId,
    actorId: adminUserId,
    event: "ampacity_table.uploaded",
    entityType: "ampacity_table",
    entityId: row.id,
    details: { name: DEMO_AMPACITY_TABLE_NAME, version: 1, rowCount: verdict.rows.length, uploadId: up.id, sha256, filename, sizeBytes: data.length, seeded: true },
  });
  return { id: row.id, rowCount: verdict.rows.length };
}
