import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { ampacityTables, auditEvents, uploads } from "@/db/schema";
import { restoreAmpacityTableAction, retireAmpacityTableAction, uploadAmpacityTableAction } from "@/app/(app)/ampacity-tables/actions";
import { findAmpacityTableDetail, getAmpacityTable, listAmpacityTables } from "@/db/queries/ampacity-tables";
import { GET as getTableApi } from "@/app/api/v1/ampacity-tables/[id]/route";
import { GET as listTablesApi } from "@/app/api/v1/ampacity-tables/route";
import { GET as getFile } from "@/app/(app)/ampacity-tables/[id]/file/route";
import { sha256Hex } from "@/db/queries/uploads";
import { voltageDrop } from "@/lib/engine/voltage-drop";
import { makeOrg, makeUser, type TestUser } from "../support/db";
import { DEMO_AMPACITY_TABLE_NAME, seedDemoAmpacityTable } from "@/scripts/demo/seed-ampacity";

// The ampacity table upload through the real server actions (session replaced by the user
// in `session`), against the test database: versions, concurrency, refusal of a bad file
// with nothing stored, permissions, tenancy, retire/restore, the JSON API and the download.
const session = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("next-auth", async (importOriginal) => ({
  ...(await importOriginal<typeof import("next-auth")>()),
  getServerSession: async () => (session.userId ? { user: { id: session.userId } } : null),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const HEADER = "size (mm2),label,material,insulation,installation method,reference ambient (C),conductor max (C),amps";
const GOOD = [HEADER, "70,,copper,xlpe,E,30,90,251", "95,,copper,xlpe,E,30,90,304", "120,,copper,xlpe,E,30,90,352"].join("\n") + "\n";

function form(name: string, csv: string, filename = "table.csv", source = "Illustrative test values"): FormData {
  const f = new FormData();
  f.set("name", name);
  f.set("source", source);
  f.set("file", new File([csv], filename, { type: "text/csv" }));
  return f;
}

let admin: TestUser;
let engineer: TestUser;
let viewer: TestUser;
let otherAdmin: TestUser;

beforeAll(async () => {
  const org = await makeOrg("Fenwick Switchgear Works");
  admin = await makeUser(org.id, "admin");
  engineer = await makeUser(org.id, "engineer");
  viewer = await makeUser(org.id, "viewer");
  const other = await makeOrg("Holloway Panel Shop");
  otherAdmin = await makeUser(other.id, "admin");
});

afterAll(async () => {
  await closeDb();
});

async function upload(user: TestUser, name: string, csv: string, filename?: string) {
  session.userId = user.id;
  return uploadAmpacityTableAction(form(name, csv, filename));
}

describe("ampacity table upload", () => {
  it("stores version 1, then version 2 under the same name, keeping the file byte for byte with its audit event", async () => {
    const v1 = await upload(admin, "Site code XLPE", GOOD);
    expect(v1).toMatchObject({ ok: true, data: { stored: true, name: "Site code XLPE", version: 1, rowCount: 3 } });
    const v2 = await upload(admin, "  site code xlpe ", GOOD.replace("304", "305"));
    // The same name compared as the database does (case-insensitively) keeps the first spelling.
    expect(v2).toMatchObject({ ok: true, data: { stored: true, name: "Site code XLPE", version: 2 } });
    if (!v1.ok || !v1.data.stored || !v2.ok || !v2.data.stored) return;
    const id1 = v1.data.id;
    const id2 = v2.data.id;

    const t2 = await findAmpacityTableDetail(admin.organisationId, id2);
    expect(t2.rows.find((r) => Math.abs(r.size_m2 - 95e-6) < 1e-12)?.ampacity_A).toBe(305);
    expect(t2.versions.map((v) => v.version)).toEqual([2, 1]);
    const [file] = await db().select().from(uploads).where(eq(uploads.id, t2.uploadId));
    expect(file).toMatchObject({ kind: "ampacity-table", organisationId: admin.organisationId, sha256: t2.fileSha256 });
    expect(file!.data.toString("utf8")).toBe(GOOD.replace("304", "305"));
    expect(t2.fileSha256).toBe(sha256Hex(Buffer.from(GOOD.replace("304", "305"))));
    const events = await db()
      .select({ details: auditEvents.details, entityId: auditEvents.entityId })
      .from(auditEvents)
      .where(and(eq(auditEvents.organisationId, admin.organisationId), eq(auditEvents.event, "ampacity_table.uploaded")));
    expect(events.map((e) => e.entityId)).toEqual(expect.arrayContaining([id1, id2]));
    expect(events.find((e) => e.entityId === id2)?.details).toMatchObject({ version: 2, rowCount: 3, sha256: t2.fileSha256 });

    const list = await listAmpacityTables(admin.organisationId);
    expect(list.filter((t) => t.name === "Site code XLPE").map((t) => t.version)).toEqual([2, 1]);
  });

  it("concurrent uploads of the same name get distinct versions", async () => {
    const results = await Promise.all(Array.from({ length: 4 }, () => upload(admin, "Concurrent", GOOD)));
    const versions = results.map((r) => (r.ok && r.data.stored ? r.data.version : null));
    expect(versions.every((v) => v !== null)).toBe(true);
    expect([...versions].sort()).toEqual([1, 2, 3, 4]);
    const rows = await db().select({ v: ampacityTables.version }).from(ampacityTables).where(and(eq(ampacityTables.organisationId, admin.organisationId), eq(ampacityTables.name, "Concurrent")));
    expect(rows.map((r) => r.v).sort()).toEqual([1, 2, 3, 4]);
  });

  it("a file with bad rows is refused whole with every row error, and nothing is stored", async () => {
    const before = await db().select({ id: uploads.id }).from(uploads).where(eq(uploads.organisationId, admin.organisationId));
    const bad = [HEADER, "70,,copper,xlpe,E,30,90,251", "95,,copper,xlpe,E,30,90,-4", "120,,brass,xlpe,E,30,90,352", "70,,copper,xlpe,E,30,90,250"].join("\n");
    const r = await upload(admin, "Bad table", bad);
    expect(r.ok).toBe(true);
    if (!r.ok || r.data.stored) throw new Error("expected a refusal");
    expect(r.data.message).toMatch(/not stored: a code table must be complete/);
    expect(r.data.total).toBe(3);
    expect(r.data.errors.map((e) => [e.line, e.column ?? null])).toEqual([
      [3, "amps"],
      [4, "material"],
      [5, null],
    ]);
    expect(r.data.errors[2]!.message).toMatch(/Duplicate row: line 2/);
    const after = await db().select({ id: uploads.id }).from(uploads).where(eq(uploads.organisationId, admin.organisationId));
    expect(after).toHaveLength(before.length);
    expect((await listAmpacityTables(admin.organisationId)).some((t) => t.name === "Bad table")).toBe(false);
  });

  it("file-level and form problems come back on their fields", async () => {
    expect(await upload(admin, "", GOOD)).toMatchObject({ ok: false, error: { code: "validation", fields: { name: expect.stringMatching(/Table name is required/) } } });
    expect(await upload(admin, "X", GOOD, "table.xlsx")).toMatchObject({ ok: false, error: { fields: { file: expect.stringMatching(/not a CSV file/) } } });
    const huge = HEADER + "\n" + "x".repeat(2 * 1024 * 1024);
    expect(await upload(admin, "X", huge)).toMatchObject({ ok: false, error: { fields: { file: expect.stringMatching(/at most 2 MB/) } } });
    session.userId = admin.id;
    const noSource = form("X", GOOD, "t.csv", "");
    expect(await uploadAmpacityTableAction(noSource)).toMatchObject({ ok: false, error: { fields: { source: expect.stringMatching(/Source is required/) } } });
  });

  it("viewers and engineers cannot upload, retire or restore", async () => {
    for (const u of [viewer, engineer]) {
      expect(await upload(u, "Not mine", GOOD)).toMatchObject({ ok: false, error: { code: "forbidden" } });
      session.userId = u.id;
      expect(await retireAmpacityTableAction({ id: 1 })).toMatchObject({ ok: false, error: { code: "forbidden" } });
    }
    expect((await listAmpacityTables(admin.organisationId)).some((t) => t.name === "Not mine")).toBe(false);
  });

  it("another organisation's table is a 404 in queries, actions, the API and the download", async () => {
    const mine = await upload(admin, "Private", GOOD);
    if (!mine.ok || !mine.data.stored) throw new Error("upload failed");
    const id = mine.data.id;
    expect(await getAmpacityTable(otherAdmin.organisationId, id)).toBeNull();
    await expect(findAmpacityTableDetail(otherAdmin.organisationId, id)).rejects.toMatchObject({ status: 404 });
    session.userId = otherAdmin.id;
    expect(await retireAmpacityTableAction({ id })).toMatchObject({ ok: false, error: { code: "not_found" } });
    const req = (url: string) => new Request(`http://localhost${url}`);
    expect((await getTableApi(req(`/api/v1/ampacity-tables/${id}`), { params: Promise.resolve({ id: String(id) }) })).status).toBe(404);
    expect((await getFile(req(`/ampacity-tables/${id}/file`), { params: Promise.resolve({ id: String(id) }) })).status).toBe(404);
    expect(((await (await listTablesApi(req("/api/v1/ampacity-tables"), { params: Promise.resolve({}) })).json()) as { tables: unknown[] }).tables).toEqual([]);

    session.userId = viewer.id;
    const res = await getTableApi(req(`/api/v1/ampacity-tables/${id}`), { params: Promise.resolve({ id: String(id) }) });
    expect(res.status).toBe(200);
    const body = (await res.json()) as { table: { name: string; version: number; rows: unknown[]; fileSha256: string } };
    expect(body.table).toMatchObject({ name: "Private", version: 1 });
    expect(body.table.rows).toHaveLength(3);
    const dl = await getFile(req(`/ampacity-tables/${id}/file`), { params: Promise.resolve({ id: String(id) }) });
    expect(dl.status).toBe(200);
    expect(await dl.text()).toBe(GOOD);
    expect(dl.headers.get("x-content-sha256")).toBe(body.table.fileSha256);
  });

  it("retire hides a version from activeOnly (and ?active=1), restore brings it back, each audited", async () => {
    const r = await upload(admin, "Retire me", GOOD);
    if (!r.ok || !r.data.stored) throw new Error("upload failed");
    const id = r.data.id;
    session.userId = admin.id;
    expect(await retireAmpacityTableAction({ id })).toMatchObject({ ok: true, data: { active: false } });
    expect((await listAmpacityTables(admin.organisationId, { activeOnly: true })).some((t) => t.id === id)).toBe(false);
    expect((await listAmpacityTables(admin.organisationId)).find((t) => t.id === id)).toMatchObject({ active: false, retiredAt: expect.any(Date) });
    const api = (await (await listTablesApi(new Request("http://localhost/api/v1/ampacity-tables?active=1"), { params: Promise.resolve({}) })).json()) as { tables: { id: number }[] };
    expect(api.tables.some((t) => t.id === id)).toBe(false);
    // Retiring twice is refused, saying so.
    expect(await retireAmpacityTableAction({ id })).toMatchObject({ ok: false, error: { code: "conflict", message: "Retire me v1 is already retired" } });
    expect(await restoreAmpacityTableAction({ id })).toMatchObject({ ok: true, data: { active: true } });
    expect((await listAmpacityTables(admin.organisationId, { activeOnly: true })).some((t) => t.id === id)).toBe(true);
    const events = await db()
      .select({ event: auditEvents.event })
      .from(auditEvents)
      .where(and(eq(auditEvents.organisationId, admin.organisationId), eq(auditEvents.entityType, "ampacity_table"), eq(auditEvents.entityId, id)));
    expect(events.map((e) => e.event)).toEqual(["ampacity_table.uploaded", "ampacity_table.retired", "ampacity_table.restored"]);
  });

  it("a stored table feeds the feeder calculation through a snapshot of its rows", async () => {
    const r = await upload(admin, "For feeders", GOOD);
    if (!r.ok || !r.data.stored) throw new Error("upload failed");
    const t = (await getAmpacityTable(admin.organisationId, r.data.id))!;
    const rows = t.rows.filter((x) => x.material === "copper" && x.insulation === "xlpe" && x.installation === "E");
    const res = voltageDrop({
      system: "ac-3ph-4w",
      nominalVoltage_V: 400,
      current_A: 200,
      length_m: 50,
      area_m2: 95e-6,
      insulation: "xlpe",
      ambient_C: 30,
      ampacityFromTable: { table: { id: t.id, name: t.name, version: t.version, source: t.source, rows }, installation: "E", insulation: "xlpe" },
    });
    expect(res.results.tableAmpacity_A).toBe(304);
    expect(res.results.ampacityTable?.title).toBe("Ampacity table For feeders v1");
  });

  it("the demo table seeds as version 1 with every row of the demo CSV, marked as illustrative", async () => {
    const org = await makeOrg("Demo seed check");
    const who = await makeUser(org.id, "admin");
    const r = await db().transaction((tx) => seedDemoAmpacityTable(tx, org.id, who.id));
    const [t] = await listAmpacityTables(org.id);
    expect(t).toMatchObject({ id: r.id, name: DEMO_AMPACITY_TABLE_NAME, version: 1, active: true, rowCount: r.rowCount });
    expect(r.rowCount).toBeGreaterThan(50);
    expect(t!.source).toMatch(/Illustrative demo values/);
  });
});
