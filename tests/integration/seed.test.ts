import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { ampacityTables, auditEvents, cableSchedules, organisations, projects, sheetRevisions, sheets, users } from "@/db/schema";
import { verifyPassword } from "@/lib/auth/password";
import { toProjectFormValues } from "@/lib/validation/project";
import { ENGINE_VERSION } from "@/lib/engine";
import { contentHash } from "@/lib/hash";
import { DEMO_SHEETS, DEMO_USERS, seedDemo } from "../../scripts/seed";
import { resetDb } from "../support/db";

async function counts() {
  const n = async (
    t: typeof organisations | typeof users | typeof projects | typeof auditEvents | typeof sheets | typeof sheetRevisions | typeof ampacityTables | typeof cableSchedules,
  ) =>
    (await db().select({ n: count() }).from(t))[0]!.n;
  return {
    organisations: await n(organisations),
    users: await n(users),
    projects: await n(projects),
    sheets: await n(sheets),
    revisions: await n(sheetRevisions),
    audit: await n(auditEvents),
    ampacityTables: await n(ampacityTables),
    schedules: await n(cableSchedules),
  };
}

describe("demo seed", () => {
  beforeAll(async () => {
    await resetDb();
  });
  afterAll(async () => {
    await closeDb();
  });

  it("creates one organisation, one user per role, three projects, five sheets, a cable schedule and an ampacity table, then does nothing the second time", async () => {
    const first = await seedDemo(db());
    expect(first.created).toBe(true);
    const after = await counts();
    // Audit: 3 projects created; 5 sheets created, 3 submitted, 2 approved; 1 table uploaded; 1 schedule uploaded.
    expect(after).toEqual({ organisations: 1, users: 4, projects: 3, sheets: 5, revisions: 5, audit: 15, ampacityTables: 1, schedules: 1 });

    const second = await seedDemo(db());
    expect(second.created).toBe(false);
    expect(second.organisationId).toBe(first.organisationId);
    expect(await counts()).toEqual(after);
  });

  it("stores verifiable password hashes for the printed demo passwords", async () => {
    expect(new Set(DEMO_USERS.map((u) => u.role))).toEqual(new Set(["admin", "lead", "engineer", "viewer"]));
    for (const u of DEMO_USERS) {
      const [row] = await db().select({ hash: users.passwordHash, role: users.role, name: users.name }).from(users).where(eq(users.email, u.email));
      expect(row).toMatchObject({ role: u.role, name: u.name });
      expect(row!.hash).not.toBe(u.password);
      expect(await verifyPassword(row!.hash, u.password)).toBe(true);
      expect(await verifyPassword(row!.hash, `${u.password}x`)).toBe(false);
    }
  });

  it("seeds projects that pass the project form's own rules, the imperial one in °F and ft", async () => {
    const rows = await db().select().from(projects).orderBy(projects.code);
    expect(rows.map((r) => r.code)).toEqual(["WPC-24017", "WPC-24022", "WPC-24031"]);
    const cp7 = rows[2]!;
    const form = toProjectFormValues({ ...cp7, designAmbientC: cp7.designAmbient, altitudeM: cp7.altitude });
    expect(form).toMatchObject({ unitSystem: "imperial", frequency: "60", designAmbient: "104", altitude: "850" });
    const { projectSchema } = await import("@/lib/validation/project");
    for (const r of rows) {
      const parsed = projectSchema.safeParse(toProjectFormValues({ ...r, designAmbientC: r.designAmbient, altitudeM: r.altitude }));
      expect(parsed.success, r.code).toBe(true);
    }
  });

  it("seeds sheets in each review state whose stored results are the engine's own for their inputs", async () => {
    const rows = await db()
      .select({ tag: sheets.tag, kind: sheets.kind, status: sheetRevisions.status, inputs: sheetRevisions.inputs, results: sheetRevisions.results, hash: sheetRevisions.contentHash, engine: sheetRevisions.engineVersion, checkedById: sheetRevisions.checkedById, authorId: sheetRevisions.authorId })
      .from(sheets)
      .innerJoin(sheetRevisions, eq(sheetRevisions.sheetId, sheets.id));
    expect(rows.map((r) => [r.tag, r.status]).sort()).toEqual(DEMO_SHEETS.map((d) => [d.tag, d.status]).sort());
    for (const r of rows) {
      expect(r.engine).toBe(ENGINE_VERSION);
      expect(r.hash).toBe(contentHash(r.inputs, r.results, ENGINE_VERSION));
      expect((r.results as { kind?: string }).kind).toBe(r.kind);
      if (r.status === "approved") expect(r.checkedById).not.toBe(r.authorId);
    }
  });
});
