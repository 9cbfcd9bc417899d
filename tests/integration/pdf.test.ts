import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { closeDb, db } from "@/db/client";
import { projects } from "@/db/schema";
import { GET as sheetPdfRoute } from "@/app/api/v1/sheets/[id]/pdf/route";
import { GET as packageGet, POST as packagePost } from "@/app/api/v1/projects/[id]/package/route";
import { auditEvents } from "@/db/schema";
import { and, eq } from "drizzle-orm";
import { createHash } from "node:crypto";
import { CALC_EXAMPLES } from "@/app/api/v1/calc/examples";
import type { Actor } from "@/lib/auth/guard";
import { verificationCode } from "@/lib/pdf/verification-code";
import { createSheet, getSheet, transitionSheet } from "@/lib/sheets/service";
import { actorOf, tokenFor } from "../support/api";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// No session cookie in these tests: only bearer tokens authenticate.
vi.mock("next-auth", async (importOriginal) => ({ ...(await importOriginal<typeof import("next-auth")>()), getServerSession: async () => null }));

// Sheet PDFs through the real route handler, guard, reads and test database; the text is
// read back with poppler's pdftotext (page by page with -f/-l) and the fonts with pdffonts.
const OUT = process.env.OHMSTEAD_PDF_OUT ?? mkdtempSync(path.join(tmpdir(), "ohm-pdf-"));

async function fetchPdf<P extends Record<string, string>>(handler: (req: Request, ctx: { params: Promise<P> }) => Promise<Response>, url: string, params: P, token: string, init: RequestInit = {}) {
  const res = await handler(new Request(url, { ...init, headers: { authorization: `Bearer ${token}`, ...(init.headers ?? {}) } }), { params: Promise.resolve(params) });
  return { status: res.status, type: res.headers.get("content-type"), body: Buffer.from(await res.arrayBuffer()) };
}

let fileSeq = 0;
function save(pdf: Buffer, name: string): string {
  const file = path.join(OUT, `${++fileSeq}-${name}.pdf`);
  writeFileSync(file, pdf);
  return file;
}
const pdftotext = (file: string, page?: number, mode = "-layout") =>
  execFileSync("pdftotext", [...(page ? ["-f", String(page), "-l", String(page)] : []), mode, file, "-"], { encoding: "utf8" });
/** The watermark is set diagonally, so pdftotext returns it letter by letter in drawing order (-raw). */
const hasWatermark = (file: string, page: number) => /D\s*R\s*A\s*F\s*T/.test(pdftotext(file, page, "-raw"));
const pageCount = (file: string) => Number(/Pages:\s+(\d+)/.exec(execFileSync("pdfinfo", [file], { encoding: "utf8" }))?.[1]);
const squash = (s: string) => s.replace(/\s+/g, " ");

let author: TestUser;
let lead: TestUser;
let authorToken = "";
let viewerToken = "";
let outsiderToken = "";
let projectId = 0;
let emptyProjectId = 0;
let leadToken = "";
let approvedId = 0;
let draftId = 0;

async function approve(a: Actor, l: Actor, sheetId: number, version: number): Promise<number> {
  const v1 = (await transitionSheet(a, { sheetId, version, transition: "submit" })).version;
  return (await transitionSheet(l, { sheetId, version: v1, transition: "approve" })).version;
}

beforeAll(async () => {
  const org = await makeOrg("Fenwick Panelworks");
  author = await makeUser(org.id, "engineer", { name: "Ada Marlowe" });
  lead = await makeUser(org.id, "lead", { name: "Tobias Wren" });
  const viewer = await makeUser(org.id, "viewer");
  const other = await makeOrg("Other Switchgear Co");
  const outsider = await makeUser(other.id, "admin");
  [authorToken, viewerToken, outsiderToken, leadToken] = await Promise.all([tokenFor(author), tokenFor(viewer), tokenFor(outsider), tokenFor(lead)]);
  const [p] = await db()
    .insert(projects)
    .values({
      organisationId: org.id,
      code: "FPW-210",
      name: "Harbour pumping station MCC",
      client: "Estuary Water Trust",
      site: "Quay Road intake",
      systemVoltage: 400,
      systemType: "3ph-4w",
      frequency: 50,
      earthing: "TN-S",
      designAmbient: 35,
      standardFamily: "iec",
      unitSystem: "metric",
      createdById: author.id,
    })
    .$returningId();
  projectId = p!.id;
  const a = actorOf(author);
  const busbar = await createSheet(a, { projectId, kind: "busbar-rating", tag: "BR-01", title: "Main horizontal busbar", inputs: { ...CALC_EXAMPLES["busbar-rating"], current_A: 800 } });
  approvedId = busbar.sheetId;
  await approve(a, actorOf(lead), busbar.sheetId, busbar.version);
  const vd = await createSheet(a, { projectId, kind: "voltage-drop", tag: "VD-01", title: "Feeder to pump P2", inputs: CALC_EXAMPLES["voltage-drop"] });
  draftId = vd.sheetId;
  const vd2 = await createSheet(a, { projectId, kind: "voltage-drop", tag: "VD-02", title: "Feeder to the dosing skid", inputs: { ...CALC_EXAMPLES["voltage-drop"], length_m: 60 } });
  await approve(a, actorOf(lead), vd2.sheetId, vd2.version);
  const [e] = await db()
    .insert(projects)
    .values({ organisationId: org.id, code: "FPW-211", name: "Empty yard", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, earthing: "TN-S", designAmbient: 35, standardFamily: "iec", unitSystem: "metric", createdById: author.id })
    .$returningId();
  emptyProjectId = e!.id;
}, 120_000);

afterAll(async () => {
  await closeDb();
});

describe("sheet PDF", () => {
  it("prints the title block, the stamp with its verification code, the method, results and cautions of an approved sheet", async () => {
    const res = await fetchPdf(sheetPdfRoute, `http://127.0.0.1/api/v1/sheets/${approvedId}/pdf`, { id: String(approvedId) }, viewerToken);
    expect(res.status).toBe(200);
    expect(res.type).toBe("application/pdf");
    expect(res.body.subarray(0, 5).toString()).toBe("%PDF-");
    const file = save(res.body, "approved");
    const all = squash(pdftotext(file));
    const pages = pageCount(file);
    expect(pages).toBeGreaterThanOrEqual(1);
    // Title block on every page: organisation, project, sheet, revision, status, people, page x of y.
    for (let page = 1; page <= pages; page++) {
      const t = squash(pdftotext(file, page));
      for (const s of ["Fenwick Panelworks", "FPW-210", "Harbour pumping station MCC", "BR-01", "Main horizontal busbar", "Approved", "Ada Marlowe", "Tobias Wren", `${page} of ${pages}`]) expect(t).toContain(s);
      expect(t).toContain("Design aid. Verify under the governing standard and local codes; a qualified engineer decides.");
    }
    const sheet = await getSheet(actorOf(author), approvedId);
    const rev = sheet.current;
    const code = verificationCode(rev.contentHash, approvedId, rev.ordinal);
    expect(code).toMatch(/^[A-Z2-7]{10}$/);
    const today = rev.decidedAt!.toISOString().slice(0, 10);
    expect(all).toMatch(new RegExp(`APPROVED Approved by Tobias Wren.*Date ${today}.*Revision ${rev.label}.*Verify code ${code}`));
    expect(all).toContain(`/verify/${code}`);
    for (let page = 1; page <= pages; page++) expect(hasWatermark(file, page)).toBe(false);
    expect(all).toContain("Inputs");
    expect(all).toContain("Method");
    expect(all).toContain("Source:");
    expect(all).toContain("Checks against limits");
    expect(all).toMatch(/PASS|FAIL/);
    expect(all).toContain("Estuary Water Trust");
  });

  it("embeds every font it uses", async () => {
    const res = await fetchPdf(sheetPdfRoute, `http://127.0.0.1/api/v1/sheets/${approvedId}/pdf`, { id: String(approvedId) }, authorToken);
    const file = save(res.body, "fonts");
    const lines = execFileSync("pdffonts", [file], { encoding: "utf8" }).trim().split("\n").slice(2);
    expect(lines.length).toBeGreaterThan(0);
    for (const l of lines) {
      expect(l).toMatch(/IBMPlex/);
      // Columns: name type encoding emb sub uni object ID — "yes" for embedded.
      expect(l.split(/\s+/).slice(-5)[0]).toBe("yes");
    }
  });

  it("marks a draft with a DRAFT watermark and no stamp, in the project's units", async () => {
    const res = await fetchPdf(sheetPdfRoute, `http://127.0.0.1/api/v1/sheets/${draftId}/pdf`, { id: String(draftId) }, authorToken);
    expect(res.status).toBe(200);
    const file = save(res.body, "draft");
    const all = squash(pdftotext(file));
    for (let page = 1; page <= pageCount(file); page++) expect(hasWatermark(file, page)).toBe(true);
    expect(all).toContain("Draft");
    expect(all).not.toMatch(/APPROVED\s+Approved by/);
    expect(all).not.toContain("Verify code");
    expect(all).not.toContain("/verify/");
    expect(all).toContain("VD-01");
    expect(all).toContain("Voltage (V)");
    expect(all).toContain("Design aid. Verify under the governing standard and local codes; a qualified engineer decides.");
  });

  it("prints an older revision with ?rev= and refuses a revision that does not exist", async () => {
    const ok = await fetchPdf(sheetPdfRoute, `http://127.0.0.1/api/v1/sheets/${approvedId}/pdf?rev=0`, { id: String(approvedId) }, authorToken);
    expect(ok.status).toBe(200);
    const missing = await fetchPdf(sheetPdfRoute, `http://127.0.0.1/api/v1/sheets/${approvedId}/pdf?rev=9`, { id: String(approvedId) }, authorToken);
    expect(missing.status).toBe(404);
    const bad = await fetchPdf(sheetPdfRoute, `http://127.0.0.1/api/v1/sheets/${approvedId}/pdf?rev=x`, { id: String(approvedId) }, authorToken);
    expect(bad.status).toBe(400);
  });

  it("is a 404 for another organisation and a 401 without a token", async () => {
    const other = await fetchPdf(sheetPdfRoute, `http://127.0.0.1/api/v1/sheets/${approvedId}/pdf`, { id: String(approvedId) }, outsiderToken);
    expect(other.status).toBe(404);
    expect(other.type).toContain("application/json");
    const anon = await sheetPdfRoute(new Request(`http://127.0.0.1/api/v1/sheets/${approvedId}/pdf`), { params: Promise.resolve({ id: String(approvedId) }) });
    expect(anon.status).toBe(401);
  });
});

/** Index rows "TAG title rev page" of the package's index page. */
function indexRows(file: string, page: number): { tag: string; page: number }[] {
  return pdftotext(file, page)
    .split("\n")
    .map((l) => /^\s*([A-Z]{2}-\d{2}|—)\s+.*?\s(\d+)\s*$/.exec(l))
    .filter((m): m is RegExpExecArray => m !== null)
    .map((m) => ({ tag: m[1]!, page: Number(m[2]) }));
}

describe("calculation package", () => {
  const url = (q = "") => `http://127.0.0.1/api/v1/projects/${projectId}/package${q}`;
  const post = (token: string, body: unknown, pid = projectId) =>
    fetchPdf(packagePost, `http://127.0.0.1/api/v1/projects/${pid}/package`, { id: String(pid) }, token, { method: "POST", body: JSON.stringify(body), headers: { "content-type": "application/json" } });

  it("issues every approved sheet with cover, status table, an index whose page numbers are where the sheets start, and the basis page", async () => {
    const res = await post(authorToken, {});
    expect(res.status).toBe(201);
    const issued = JSON.parse(res.body.toString()) as { uploadId: number; sha256: string; label: string; sheetCount: number };
    expect(issued.sheetCount).toBe(2);
    expect(issued.label).toBe("P1");

    const dl = await fetchPdf(packageGet, url(`?upload=${issued.uploadId}`), { id: String(projectId) }, viewerToken);
    expect(dl.status).toBe(200);
    expect(dl.type).toBe("application/pdf");
    expect(createHash("sha256").update(dl.body).digest("hex")).toBe(issued.sha256);
    const file = save(dl.body, "package");
    const pages = pageCount(file);

    const cover = squash(pdftotext(file, 1));
    for (const s of ["CALCULATION PACKAGE", "FPW-210", "Harbour pumping station MCC", "Estuary Water Trust", "Quay Road intake", "P1", "Fenwick Panelworks", `1 of ${pages}`]) expect(cover).toContain(s);
    const status = squash(pdftotext(file, 2));
    expect(status).toMatch(/BR-01 Main horizontal busbar A Approved Ada Marlowe Tobias Wren/);
    expect(status).toContain("VD-02");
    expect(status).not.toContain("VD-01");

    const rows = indexRows(file, 3);
    expect(rows.map((r) => r.tag)).toEqual(["BR-01", "VD-02", "—"]);
    const titles: Record<string, string> = { "BR-01": "Main horizontal busbar", "VD-02": "Feeder to the dosing skid" };
    for (const r of rows.slice(0, 2)) {
      // The sheet's first page opens with "<tag> <title>" and its title block; the page before is another part's.
      expect(squash(pdftotext(file, r.page))).toContain(`${r.tag} ${titles[r.tag]} APPROVED`);
      expect(squash(pdftotext(file, r.page))).toContain(`FPW-210 ${r.tag}`);
      expect(squash(pdftotext(file, r.page - 1))).not.toContain(`FPW-210 ${r.tag}`);
    }
    expect(rows[1]!.page).toBeGreaterThan(rows[0]!.page + 1);
    const basis = squash(pdftotext(file, rows[2]!.page));
    expect(basis).toContain("Basis of calculation and cautions");
    expect(basis).toContain("Design aid. Verify under the governing standard and local codes; a qualified engineer decides.");
    expect(basis).toContain("IEC 60364-5-52:2009 Annex G");
    expect(basis).toContain("licensed engineering practice govern");
    expect(rows[2]!.page).toBe(pages);
    for (let p = 1; p <= pages; p++) expect(hasWatermark(file, p)).toBe(false);

    const [event] = await db()
      .select({ details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.event, "package.issued"), eq(auditEvents.entityId, projectId)));
    expect(event?.details).toMatchObject({ uploadId: issued.uploadId, sha256: issued.sha256, label: "P1", sheetCount: 2 });
  }, 60_000);

  it("includes drafts watermarked when asked, and numbers the packages", async () => {
    const res = await post(leadToken, { includeDrafts: true });
    expect(res.status).toBe(201);
    const issued = JSON.parse(res.body.toString()) as { uploadId: number; label: string; sheetCount: number };
    expect(issued).toMatchObject({ label: "P2", sheetCount: 3 });
    const dl = await fetchPdf(packageGet, url(`?upload=${issued.uploadId}`), { id: String(projectId) }, authorToken);
    const file = save(dl.body, "package-drafts");
    const rows = indexRows(file, 3);
    expect(rows.map((r) => r.tag)).toEqual(["BR-01", "VD-01", "VD-02", "—"]);
    const draft = rows[1]!;
    expect(hasWatermark(file, draft.page)).toBe(true);
    expect(hasWatermark(file, rows[0]!.page)).toBe(false);
    expect(hasWatermark(file, rows[2]!.page)).toBe(false);
  }, 60_000);

  it("refuses viewers (403), other organisations (404), bad bodies (400) and an empty project (400)", async () => {
    expect((await post(viewerToken, {})).status).toBe(403);
    expect((await post(outsiderToken, {})).status).toBe(404);
    expect((await post(authorToken, { includeDrafts: "yes" })).status).toBe(400);
    const empty = await post(authorToken, {}, emptyProjectId);
    expect(empty.status).toBe(400);
    expect(JSON.parse(empty.body.toString()).error.fields.includeDrafts).toMatch(/No sheet of the project is approved yet/);
    const first = await post(authorToken, {});
    const { uploadId } = JSON.parse(first.body.toString()) as { uploadId: number };
    expect((await fetchPdf(packageGet, url(`?upload=${uploadId}`), { id: String(projectId) }, outsiderToken)).status).toBe(404);
    expect((await fetchPdf(packageGet, `http://127.0.0.1/api/v1/projects/${emptyProjectId}/package?upload=${uploadId}`, { id: String(emptyProjectId) }, authorToken)).status).toBe(404);
    expect((await fetchPdf(packageGet, url("?upload=abc"), { id: String(projectId) }, authorToken)).status).toBe(400);
  }, 60_000);
});
