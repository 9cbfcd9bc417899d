import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { auditEvents, projects, sheetRevisions } from "@/db/schema";
import type { Actor } from "@/lib/auth/guard";
import { ENGINE_VERSION } from "@/lib/engine";
import type { NetworkResults } from "@/lib/engine/network";
import { AppError } from "@/lib/errors";
import { contentHash } from "@/lib/hash";
import { defaultInputs, type ProjectBasis } from "@/lib/sheets/kinds";
import { parseNetworkFile } from "@/lib/sheets/network-import";
import { createSheet, getRevision, importNetwork, STALE_SHEET_MESSAGE, transitionSheet } from "@/lib/sheets/service";
import { networkCsv, sparePanel } from "../../bench/network-server";
import { makeOrg, makeUser, type TestUser } from "../support/db";

const actorOf = (u: TestUser): Actor => ({ id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });
const BASIS: ProjectBasis = { unitSystem: "metric", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, designAmbientC: 35, altitudeM: 0, standardFamily: "iec" };

async function caught(p: Promise<unknown>): Promise<AppError> {
  try {
    await p;
  } catch (err) {
    expect(err).toBeInstanceOf(AppError);
    return err as AppError;
  }
  throw new Error("expected the call to fail");
}

let seq = 0;
async function world() {
  const org = await makeOrg("Network Works");
  const eng = actorOf(await makeUser(org.id, "engineer"));
  const lead = actorOf(await makeUser(org.id, "lead"));
  const [p] = await db()
    .insert(projects)
    .values({ organisationId: org.id, code: `NW-${++seq}`, name: "Distribution board", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, earthing: "TN-S", designAmbient: 35, standardFamily: "iec", unitSystem: "metric", createdById: eng.id })
    .$returningId();
  const sheet = await createSheet(eng, { projectId: p!.id, kind: "bus-network", tag: `BN-${seq}`, title: "Main distribution", inputs: defaultInputs("bus-network", BASIS) });
  return { org, eng, lead, projectId: p!.id, sheet };
}

beforeAll(async () => {
  await db().execute("SELECT 1");
});
afterAll(async () => {
  await closeDb();
});

describe("network import through the sheet service", () => {
  it("imports a generated 100 000-node network: stored with its server result, hottest segments and exactly 0 A in the spare ways", async () => {
    const w = await world();
    const net = sparePanel(100_000, "ac");
    const file = new TextEncoder().encode(JSON.stringify(net));
    const parsed = parseNetworkFile("panel.json", file);
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.problems));
    expect(parsed.counts.nodes).toBeGreaterThanOrEqual(99_000);

    const r = await importNetwork(w.eng, { sheetId: w.sheet.sheetId, version: w.sheet.version, network: parsed.network as never, source: { fileName: "panel.json", format: "json", bytes: file.byteLength } });
    expect(r).toMatchObject({ version: w.sheet.version + 1, newRevision: false, inputErrors: null, revision: { ordinal: 0, status: "draft" } });
    expect(r.counts).toEqual({ nodes: net.nodes.length, segments: net.segments.length, loads: net.loads!.length, supplies: net.supplies.length });
    expect(r.solveMs).toBeGreaterThan(0);

    // read back from the database: inputs, the result, engine version and content hash
    const back = await getRevision(w.eng, w.sheet.sheetId, 0);
    expect((back.inputs.segments as unknown[]).length).toBe(net.segments.length);
    const res = back.results!.results as unknown as NetworkResults;
    // a large network is stored with its per-segment values as columns (compactNetworkResult)
    const cols = res.columns!;
    expect(cols.segments.id).toHaveLength(net.segments.length);
    expect(cols.nodes.id).toHaveLength(net.nodes.length);
    expect(res.nodes).toHaveLength(0);
    expect(res.hottest).toHaveLength(10);
    expect(res.hottestBasis).toBe("temperature");
    // the hottest list is ordered and its segments are kept in full
    const byId = new Map(res.segments.map((s) => [s.id, s]));
    const temps = res.hottest.map((h) => h.temperature_C!);
    expect([...temps].sort((a, b) => b - a)).toEqual(temps);
    for (const h of res.hottest) expect(byId.get(h.id)!.temperature_C).toBe(h.temperature_C);
    const col = new Map(cols.segments.id.map((id, i) => [id, i]));
    const current = (id: string) => cols.segments.current_A[col.get(id)!]!;
    // every fourth terminal of each dropper (d = 3, 7) is a spare way without load: its tap-off carries exactly 0 A
    const spares = cols.segments.id.filter((id) => /^TO\d+_(3|7)$/.test(id));
    expect(spares.length).toBe(Math.round(100_000 / 17) * 2);
    for (const id of spares) {
      expect(current(id)).toBe(0);
      expect(cols.segments.loss_W[col.get(id)!]).toBe(0);
    }
    // the dead-end segments kept in full say so: no current, no direction
    for (const s of res.segments.filter((x) => /^TO\d+_(3|7)$/.test(x.id))) {
      expect(s.current_A).toBe(0);
      expect(s.direction).toBe(0);
    }
    // loaded tap-offs carry their load's current (six significant figures)
    const load = net.loads!.find((l) => l.node === "T5_0")!;
    expect(current("TO5_0")).toBeCloseTo(Number(load.current_A), 3);
    // a dropper whose last terminal is spare and whose foot is not tied is a dead end from its last node on
    const untied = cols.segments.id.filter((id) => {
      const m = /^DR(\d+)_7$/.exec(id);
      return m !== null && Number(m[1]) % 10 !== 0 && (Number(m[1]) - 1) % 10 !== 0;
    });
    for (const id of untied) expect(current(id)).toBe(0);
    expect(res.deadEndNodes).toBe(spares.length + untied.length);
    expect(cols.deadSegmentCount).toBe(spares.length + untied.length);
    expect(cols.segments.current_A.filter((c) => c === 0)).toHaveLength(spares.length + untied.length);
    expect(res.maxKclResidual_A).toBeLessThan(1e-6);
    expect(back.engineVersion).toBe(ENGINE_VERSION);
    expect(back.contentHash).toBe(contentHash(back.inputs, back.results, ENGINE_VERSION));

    // the audit event is written with the revision
    const events = await db().select().from(auditEvents).where(and(eq(auditEvents.organisationId, w.org.id), eq(auditEvents.event, "network.imported")));
    expect(events).toHaveLength(1);
    expect(events[0]!.entityId).toBe(w.sheet.sheetId);
    expect(events[0]!.details).toMatchObject({ revisionId: back.id, newRevision: false, file: { fileName: "panel.json", format: "json" }, counts: { nodes: net.nodes.length } });
  }, 180_000);

  it("another organisation's sheet is a 404 and nothing changes; a stale version is a 409", async () => {
    const w = await world();
    const other = await world();
    const small = parseNetworkFile("small.csv", networkCsv(sparePanel(200)));
    if (!small.ok) throw new Error(JSON.stringify(small.problems));
    const source = { fileName: "small.csv", format: "csv" as const, bytes: 1 };
    const e = await caught(importNetwork(other.eng, { sheetId: w.sheet.sheetId, version: w.sheet.version, network: small.network as never, source }));
    expect(e.status).toBe(404);
    const e2 = await caught(getRevision(other.eng, w.sheet.sheetId, 0));
    expect(e2.status).toBe(404);
    const [rev] = await db().select().from(sheetRevisions).where(eq(sheetRevisions.sheetId, w.sheet.sheetId));
    expect((rev!.inputs.segments as unknown[]).length).toBe(12);

    const e3 = await caught(importNetwork(w.eng, { sheetId: w.sheet.sheetId, version: w.sheet.version + 5, network: small.network as never, source }));
    expect(e3.status).toBe(409);
    expect(e3.message).toBe(STALE_SHEET_MESSAGE);
  });

  it("refuses a network the engine cannot solve and keeps the stored one", async () => {
    const w = await world();
    const net = sparePanel(200);
    // a load on a part of the network with no path to a supply
    net.nodes.push({ id: "ISL-A" }, { id: "ISL-B" });
    net.segments.push({ id: "ISL", from: "ISL-A", to: "ISL-B", conductor: "tap", length_m: 1 });
    net.loads!.push({ node: "ISL-B", current_A: 5, pf: 1 });
    const e = await caught(importNetwork(w.eng, { sheetId: w.sheet.sheetId, version: w.sheet.version, network: net as never, source: { fileName: "x.json", format: "json", bytes: 1 } }));
    expect(e.status).toBe(400);
    expect(Object.values(e.fields ?? {}).join(" ")).toMatch(/no path to a supply: ISL-A, ISL-B/);
    const back = await getRevision(w.eng, w.sheet.sheetId, 0);
    expect((back.inputs.segments as unknown[]).length).toBe(12);
  });

  it("an approved sheet gets a new draft revision from an import; the approved one stays", async () => {
    const w = await world();
    let version = (await transitionSheet(w.eng, { sheetId: w.sheet.sheetId, version: w.sheet.version, transition: "submit" })).version;
    version = (await transitionSheet(w.lead, { sheetId: w.sheet.sheetId, version, transition: "approve" })).version;
    const small = parseNetworkFile("small.json", JSON.stringify(sparePanel(300)));
    if (!small.ok) throw new Error(JSON.stringify(small.problems));
    const r = await importNetwork(w.eng, { sheetId: w.sheet.sheetId, version, network: small.network as never, source: { fileName: "small.json", format: "json", bytes: 1 } });
    expect(r).toMatchObject({ newRevision: true, revision: { ordinal: 1, status: "draft" } });
    const approved = await getRevision(w.eng, w.sheet.sheetId, 0);
    expect(approved.status).toBe("approved");
    expect((approved.inputs.segments as unknown[]).length).toBe(12);
    // a viewer-free check: a lead may import too, but only the author edits a draft in place
    const e = await caught(importNetwork(w.lead, { sheetId: w.sheet.sheetId, version: r.version, network: small.network as never, source: { fileName: "small.json", format: "json", bytes: 1 } }));
    expect(e.status).toBe(403);
  });
});
