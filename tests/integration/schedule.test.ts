import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { CALC_EXAMPLES } from "@/app/api/v1/calc/examples";
import { GET as exportRoute } from "@/app/(app)/projects/[id]/schedule/export/route";
import { GET as fileRoute } from "@/app/(app)/projects/[id]/schedule/file/route";
import { GET as templateRoute } from "@/app/(app)/projects/[id]/schedule/template/route";
import { closeDb, db } from "@/db/client";
import { ampacityTables, auditEvents, cableSchedules, projects, uploads } from "@/db/schema";
import { currentSchedule, getSchedule, listSchedules } from "@/db/queries/schedules";
import { AppError } from "@/lib/errors";
import { sha256Hex } from "@/lib/hash";
import { issuePackage } from "@/lib/pdf/package";
import { uploadSchedule } from "@/lib/schedules/service";
import { createSheet, transitionSheet } from "@/lib/sheets/service";
import { actorOf, tokenFor } from "../support/api";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// The server action reads the session through next-auth; each test says who is signed in.
const session: { userId: number | null } = { userId: null };
vi.mock("next-auth", async (importOriginal) => ({
  ...(await importOriginal<typeof import("next-auth")>()),
  getServerSession: async () => (session.userId ? { user: { id: session.userId } } : null),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { uploadScheduleAction } = await import("@/app/(app)/projects/[id]/schedule/actions");

let engineer: TestUser;
let lead: TestUser;
let viewer: TestUser;
let outsider: TestUser;
let projectId = 0;
let tableId = 0;
let retiredTableId = 0;

const HEADER = "tag,from,to,material,insulation,size (mm²),number in parallel,length (m),load current (A),power factor,system,voltage (V),installation method,ampacity (A),ambient (°C)";
/** Six feeders: four good (one failing its drop limit), two bad. Invented tags and values. */
const SCHEDULE = [
  HEADER,
  "W-101,MCC-1,P-11 pump,copper,pvc,16,1,40,28,0.84,ac-3ph-4w,400,E,,35",
  "W-102,MCC-1,P-12 pump,copper,pvc,25,1,45,44,0.85,ac-3ph-4w,400,,101,",
  "W-103,MCC-1,Fan F-3,copper,pvc,16,1,20,30,banana,ac-3ph-4w,400,,76,30",
  "W-104,MCC-1,Yard lighting,copper,pvc,2.5,1,380,16,0.95,ac-1ph-2w,230,,24,30",
  "",
  "W-105,MCC-1,Heater H-1,copper,pvc,16,1,30,20,0.99,ac-3ph-4w,400,F,,30",
  "W-106,MCC-1,Crane,copper,pvc,25,2,60,160,0.8,ac-3ph-4w,400,E,,30",
].join("\n");

const file = (text: string | Buffer, name = "mcc-1-feeders.csv") => ({ name, type: "text/csv", data: Buffer.isBuffer(text) ? text : Buffer.from(text, "utf8") });

function formOf(fields: Record<string, string>, text: string, name = "feeders.csv"): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  f.set("file", new File([text], name, { type: "text/csv" }));
  return f;
}

async function expectAppError(p: Promise<unknown>, code: AppError["code"], message?: RegExp): Promise<AppError> {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(AppError);
  const e = err as AppError;
  expect(e.code).toBe(code);
  if (message) expect(`${e.message} ${JSON.stringify(e.fields ?? {})}`).toMatch(message);
  return e;
}

async function insertTable(organisationId: number, userId: number, name: string, version: number, active: boolean): Promise<number> {
  const data = Buffer.from(`${name} v${version}`);
  const [up] = await db()
    .insert(uploads)
    .values({ organisationId, kind: "ampacity-table", filename: "table.csv", contentType: "text/csv", sizeBytes: data.length, sha256: sha256Hex(data), data, createdById: userId })
    .$returningId();
  // Invented values for the test: one installation method "E", PVC copper 16 and 25 mm².
  const rows = [
    { size_m2: 16e-6, label: "16 mm²", material: "copper", insulation: "pvc", installation: "E", referenceAmbient_C: 30, conductorMax_C: 70, ampacity_A: 80 },
    { size_m2: 25e-6, label: "25 mm²", material: "copper", insulation: "pvc", installation: "E", referenceAmbient_C: 30, conductorMax_C: 70, ampacity_A: 101 },
  ];
  const [t] = await db()
    .insert(ampacityTables)
    .values({ organisationId, name, version, source: "Workshop practice sheet 4 (test data)", rows, rowCount: rows.length, uploadId: up!.id, fileSha256: sha256Hex(data), active, createdById: userId })
    .$returningId();
  return t!.id;
}

beforeAll(async () => {
  const org = await makeOrg("Larkspur Switchgear");
  engineer = await makeUser(org.id, "engineer", { name: "Maren Tull" });
  lead = await makeUser(org.id, "lead", { name: "Osric Penhale" });
  viewer = await makeUser(org.id, "viewer");
  const other = await makeOrg("Other Panel Shop");
  outsider = await makeUser(other.id, "engineer");
  const [p] = await db()
    .insert(projects)
    .values({ organisationId: org.id, code: "LKS-410", name: "Wastewater lift station MCC", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, earthing: "TN-S", designAmbient: 35, standardFamily: "iec", unitSystem: "metric", createdById: engineer.id })
    .$returningId();
  projectId = p!.id;
  tableId = await insertTable(org.id, lead.id, "Larkspur cable ratings", 1, true);
  retiredTableId = await insertTable(org.id, lead.id, "Old ratings", 1, false);
}, 60_000);

beforeEach(() => {
  session.userId = null;
});

afterAll(async () => {
  await closeDb();
});

describe("cable schedule upload", () => {
  it("computes the valid rows, lists the bad ones by row and column, and keeps the file with its hash", async () => {
    const bytes = Buffer.from(SCHEDULE, "utf8");
    const r = await uploadSchedule(actorOf(engineer), { projectId, tableId, limitId: "iec-a-other" }, file(bytes));
    expect(r).toMatchObject({ rowCount: 6, validCount: 4, errorCount: 2 });
    expect(r.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));

    const s = await currentSchedule(engineer.organisationId, projectId);
    expect(s).not.toBeNull();
    expect(s!.id).toBe(r.id);
    expect(s!.fileSha256).toBe(r.sha256);
    expect(s!.table).toMatchObject({ id: tableId, name: "Larkspur cable ratings", version: 1 });
    expect(s!.results.map((x) => x.tag)).toEqual(["W-101", "W-102", "W-104", "W-106"]);
    expect(s!.errors).toEqual([
      { row: 4, column: "power factor", message: 'Row 4, column "power factor": power factor must be a number from 0 to 1.' },
      { row: 7, column: "installation method", message: expect.stringMatching(/^Row 7, column "installation method": table "Larkspur cable ratings" v1 has no row for 16 mm²/) },
    ]);
    // The table row: 80 A corrected to the 35 °C ambient; the empty ambient takes the project's 35 °C.
    const w101 = s!.results[0]!;
    expect(w101.ampacitySource).toBe("table");
    expect(w101.ampacity_A).toBeCloseTo(80 * Math.sqrt((70 - 35) / (70 - 30)), 9);
    expect(s!.results[1]!.ambientFromProject).toBe(true);
    expect(s!.results[1]!.ambient_C).toBe(35);
    // 2.5 mm² over 380 m fails its drop limit.
    const w104 = s!.results[2]!;
    expect(w104.pass).toBe(false);
    expect(w104.reasons.join(" ")).toMatch(/Voltage drop .* exceeds/);
    expect(s!.failCount).toBe(s!.results.filter((x) => !x.pass).length);

    // The stored file is the upload, byte for byte; its hash is the one beside the results.
    const [stored] = await db().select({ data: uploads.data, sha256: uploads.sha256, kind: uploads.kind }).from(uploads).where(eq(uploads.id, r.uploadId));
    expect(stored!.kind).toBe("cable-schedule");
    expect(Buffer.compare(stored!.data, bytes)).toBe(0);
    expect(sha256Hex(stored!.data)).toBe(s!.fileSha256);

    const [event] = await db()
      .select({ details: auditEvents.details, actorId: auditEvents.actorId })
      .from(auditEvents)
      .where(and(eq(auditEvents.event, "schedule.uploaded"), eq(auditEvents.entityType, "project"), eq(auditEvents.entityId, projectId)));
    expect(event).toMatchObject({ actorId: engineer.id, details: { scheduleId: r.id, uploadId: r.uploadId, sha256: r.sha256, rows: 6, valid: 4 } });
  });

  it("reads a semicolon file with a byte order mark and decimal commas to the same results", async () => {
    const semi = SCHEDULE.split("\n")
      .map((l) => l.replaceAll(",", ";").replace(/(\d)\.(\d)/g, "$1,$2"))
      .join("\r\n");
    const withBom = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(semi, "utf8")]);
    const before = await currentSchedule(engineer.organisationId, projectId);
    const r = await uploadSchedule(actorOf(lead), { projectId, tableId }, file(withBom, "semicolons.csv"));
    const after = await getSchedule(lead.organisationId, projectId, r.id);
    expect(after.results.length).toBe(before!.results.length);
    after.results.forEach((x, i) => expect(x.drop_percent).toBeCloseTo(before!.results[i]!.drop_percent, 12));
    expect(after.options.notices).toEqual(expect.arrayContaining([expect.stringMatching(/semicolon/), expect.stringMatching(/byte order mark/)]));
    expect((await listSchedules(lead.organisationId, projectId)).map((x) => x.id)[0]).toBe(r.id);
  });

  it("refuses a file it cannot read, a table that is not offered, and an archived project, saying why", async () => {
    const a = actorOf(engineer);
    await expectAppError(uploadSchedule(a, { projectId }, file(Buffer.from([0xff, 0xfe, 0x41, 0x00]))), "validation", /UTF-16/);
    await expectAppError(uploadSchedule(a, { projectId }, file(`${HEADER.replace("length (m)", "length (chains)")}\nA\n`)), "validation", /Column \\"length \(chains\)\\": unit \\"chains\\" is not accepted/);
    await expectAppError(uploadSchedule(a, { projectId, tableId: retiredTableId }, file(SCHEDULE)), "validation", /Old ratings v1 is retired/);
    await expectAppError(uploadSchedule(a, { projectId, tableId: 999_999 }, file(SCHEDULE)), "validation", /does not exist in your organisation/);
    await expectAppError(uploadSchedule(a, { projectId, limitPercent: "80" }, file(SCHEDULE)), "validation", /Voltage-drop limit override must be greater than 0 and up to 50 %/);
    const big = Buffer.alloc(10 * 1024 * 1024 + 1, 0x41);
    await expectAppError(uploadSchedule(a, { projectId }, file(big)), "validation", /the limit is 10 MB/);
    const [arch] = await db()
      .insert(projects)
      .values({ organisationId: engineer.organisationId, code: "LKS-OLD", name: "Archived yard", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, earthing: "TN-S", designAmbient: 30, standardFamily: "iec", unitSystem: "metric", createdById: engineer.id, archivedAt: new Date() })
      .$returningId();
    await expectAppError(uploadSchedule(a, { projectId: arch!.id }, file(SCHEDULE)), "conflict", /archived/);
  });

  it("is a 404 for another organisation, in uploads, reads and downloads", async () => {
    const o = actorOf(outsider);
    await expectAppError(uploadSchedule(o, { projectId }, file(SCHEDULE)), "not_found");
    expect(await currentSchedule(outsider.organisationId, projectId)).toBeNull();
    const own = await currentSchedule(engineer.organisationId, projectId);
    await expectAppError(getSchedule(outsider.organisationId, projectId, own!.id), "not_found");
    const token = await tokenFor(outsider);
    const params = { params: Promise.resolve({ id: String(projectId) }) };
    const auth = { headers: { authorization: `Bearer ${token}` } };
    expect((await exportRoute(new Request(`http://127.0.0.1/projects/${projectId}/schedule/export`, auth), params)).status).toBe(404);
    expect((await fileRoute(new Request(`http://127.0.0.1/projects/${projectId}/schedule/file?schedule=${own!.id}`, auth), params)).status).toBe(404);
    const count = await db().select({ id: cableSchedules.id }).from(cableSchedules).where(eq(cableSchedules.organisationId, outsider.organisationId));
    expect(count).toEqual([]);
  });

  it("lets a viewer read and download but not upload; the action checks the role", async () => {
    session.userId = viewer.id;
    const refused = await uploadScheduleAction(formOf({ projectId: String(projectId) }, SCHEDULE));
    expect(refused).toEqual({ ok: false, error: { code: "forbidden", message: "Your role does not allow this" } });
    await expectAppError(uploadSchedule(actorOf(viewer), { projectId }, file(SCHEDULE)), "forbidden");

    const token = await tokenFor(viewer);
    const params = { params: Promise.resolve({ id: String(projectId) }) };
    const auth = { headers: { authorization: `Bearer ${token}` } };
    const own = await currentSchedule(viewer.organisationId, projectId);
    const dl = await fileRoute(new Request(`http://127.0.0.1/projects/${projectId}/schedule/file?schedule=${own!.id}`, auth), params);
    expect(dl.status).toBe(200);
    const body = Buffer.from(await dl.arrayBuffer());
    expect(sha256Hex(body)).toBe(own!.fileSha256);
    expect(dl.headers.get("x-content-sha256")).toBe(own!.fileSha256);

    const ex = await exportRoute(new Request(`http://127.0.0.1/projects/${projectId}/schedule/export`, auth), params);
    expect(ex.status).toBe(200);
    expect(ex.headers.get("content-type")).toMatch(/text\/csv/);
    const csv = await ex.text();
    expect(csv.split("\r\n")).toHaveLength(own!.results.length + 1);
    const tpl = await templateRoute(new Request(`http://127.0.0.1/projects/${projectId}/schedule/template`, auth), params);
    expect((await tpl.text()).split("\r\n")[0]).toContain("tag,from,to,material");
  });

  it("uploads through the server action for an engineer, with the file's own messages", async () => {
    session.userId = engineer.id;
    const ok = await uploadScheduleAction(formOf({ projectId: String(projectId), tableId: String(tableId), limitId: "iec-a-lighting" }, SCHEDULE));
    expect(ok.ok).toBe(true);
    if (ok.ok) expect(ok.data).toMatchObject({ rowCount: 6, validCount: 4, errorCount: 2 });
    const s = await currentSchedule(engineer.organisationId, projectId);
    expect(s!.results.every((x) => x.limit_percent >= 3 && x.limit_percent <= 3.5)).toBe(true);
    const bad = await uploadScheduleAction(formOf({ projectId: String(projectId) }, "tag;material\n"));
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error.fields?.file).toMatch(/no feeder rows/);
  });
});

describe("calculation package", () => {
  it("prints the current schedule as a section after the sheets, listed in the index, with its hash, table version and caution", async () => {
    const a = actorOf(engineer);
    const sheet = await createSheet(a, { projectId, kind: "voltage-drop", tag: "VD-01", title: "Feeder to the inlet screen", inputs: CALC_EXAMPLES["voltage-drop"] });
    const v1 = (await transitionSheet(a, { sheetId: sheet.sheetId, version: sheet.version, transition: "submit" })).version;
    await transitionSheet(actorOf(lead), { sheetId: sheet.sheetId, version: v1, transition: "approve" });
    const s = await currentSchedule(engineer.organisationId, projectId);

    const issued = await issuePackage(a, projectId, { includeDrafts: false });
    const [pkg] = await db().select({ data: uploads.data }).from(uploads).where(eq(uploads.id, issued.uploadId));
    const dir = process.env.OHMSTEAD_PDF_OUT ?? mkdtempSync(path.join(tmpdir(), "ohm-schedule-"));
    const pdf = path.join(dir, "package.pdf");
    writeFileSync(pdf, pkg!.data);
    const text = execFileSync("pdftotext", ["-layout", pdf, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
    expect(text).toContain(`CS Cable schedule — ${s!.filename} (6 rows)`);
    expect(text).toContain(s!.fileSha256);
    expect(text).toContain("Larkspur cable ratings v1");
    expect(text).toMatch(/W-101 .* PASS/);
    expect(text).toMatch(/W-104 .* FAIL/);
    expect(text).toContain("Rows not computed");
    expect(text).toContain('Row 4, column "power factor"');
    expect(text).toContain("Design aid. Verify under the governing standard and local codes; a qualified engineer decides.");
    // After the sheet, before the basis page.
    expect(text.indexOf("Feeder to the inlet screen APPROVED")).toBeLessThan(text.indexOf("File SHA-256"));
    expect(text.lastIndexOf("File SHA-256")).toBeLessThan(text.lastIndexOf("Basis of calculation and cautions"));
    // The package's audit event names the schedule it printed.
    const [event] = await db()
      .select({ details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.event, "package.issued"), eq(auditEvents.entityId, projectId)));
    expect(event!.details.schedule).toEqual({ id: s!.id, filename: s!.filename, fileSha256: s!.fileSha256, resultsHash: s!.resultsHash });
  }, 90_000);
});
