import { afterAll, beforeEach, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { closeDb, db, pool } from "@/db/client";
import { auditEvents, organisations, projects, sheetRevisions, sheets } from "@/db/schema";
import { makeOrg, makeUser, resetDb } from "../support/db";

// MariaDB stores json() as LONGTEXT with a json_valid CHECK; mysql2 >= 3.23 reads the
// extended column metadata and returns objects. These tests fail if that ever regresses
// (an older mysql2, or `jsonStrings: true`) and JSON comes back as strings.

let orgId: number;
let userId: number;

beforeEach(async () => {
  await resetDb();
  orgId = (await makeOrg("Json Works")).id;
  userId = (await makeUser(orgId, "engineer")).id;
});

afterAll(async () => {
  await closeDb();
});

async function rawRow(sqlText: string, id: number): Promise<Record<string, unknown>> {
  const [rows] = (await pool().query(sqlText, [id])) as unknown as [Record<string, unknown>[]];
  const row = rows[0];
  if (!row) throw new Error("row not found");
  return row;
}

describe("JSON columns round-trip as objects", () => {
  it("organisations.settings", async () => {
    const settings = { voltageDropLimits: { feederPercent: 2.5, totalPercent: 4 } };
    await db().update(organisations).set({ settings }).where(eq(organisations.id, orgId));
    const [viaDrizzle] = await db().select({ settings: organisations.settings }).from(organisations).where(eq(organisations.id, orgId));
    expect(typeof viaDrizzle?.settings).toBe("object");
    expect(viaDrizzle?.settings).toEqual(settings);
    const raw = await rawRow("SELECT settings FROM organisations WHERE id = ?", orgId);
    expect(typeof raw.settings).toBe("object");
    expect(raw.settings).toEqual(settings);
  });

  it("organisations.settings defaults to an empty object", async () => {
    const [row] = await db().select({ settings: organisations.settings }).from(organisations).where(eq(organisations.id, orgId));
    expect(row?.settings).toEqual({});
  });

  it("audit_events.details (nested, unicode, numbers, null)", async () => {
    const details = { email: "zoë@example.test", from: "engineer", to: "lead", nested: { list: [1, 2.5, -3e-7], flag: true, none: null } };
    const [ins] = await db()
      .insert(auditEvents)
      .values({ organisationId: orgId, actorId: userId, event: "user.role_changed", entityType: "user", entityId: userId, details })
      .$returningId();
    const [viaDrizzle] = await db().select({ details: auditEvents.details }).from(auditEvents).where(eq(auditEvents.id, ins!.id));
    expect(viaDrizzle?.details).toEqual(details);
    const raw = await rawRow("SELECT details FROM audit_events WHERE id = ?", ins!.id);
    expect(typeof raw.details).toBe("object");
    expect(raw.details).toEqual(details);
  });

  it("sheet_revisions.inputs", async () => {
    const [p] = await db()
      .insert(projects)
      .values({
        organisationId: orgId,
        code: "JS-1",
        name: "Json project",
        systemVoltage: 400,
        systemType: "3ph-4w",
        frequency: 50,
        earthing: "TN-S",
        designAmbient: 35,
        standardFamily: "iec",
        unitSystem: "metric",
        createdById: userId,
      })
      .$returningId();
    const [s] = await db()
      .insert(sheets)
      .values({ organisationId: orgId, projectId: p!.id, kind: "busbar", tag: "BB-1", title: "Main busbar", createdById: userId })
      .$returningId();
    const inputs = { current_A: 1600, arrangement: { barsPerPhase: 2, barWidth_m: 0.1 }, materialId: "cu-etp", notes: "line 1\nline \"2\"" };
    const [r] = await db()
      .insert(sheetRevisions)
      .values({ organisationId: orgId, sheetId: s!.id, ordinal: 0, label: "A", inputs, engineVersion: "test", contentHash: "0".repeat(64), authorId: userId })
      .$returningId();
    const [viaDrizzle] = await db().select({ inputs: sheetRevisions.inputs, results: sheetRevisions.results }).from(sheetRevisions).where(eq(sheetRevisions.id, r!.id));
    expect(viaDrizzle?.inputs).toEqual(inputs);
    expect(viaDrizzle?.results).toBeNull();
    const raw = await rawRow("SELECT inputs FROM sheet_revisions WHERE id = ?", r!.id);
    expect(typeof raw.inputs).toBe("object");
    expect(raw.inputs).toEqual(inputs);
  });
});
