import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { auditEvents, organisations, projects, sheetRevisions, sheets } from "@/db/schema";
import type { Actor } from "@/lib/auth/guard";
import { ENGINE_VERSION, runCalc } from "@/lib/engine";
import { AppError } from "@/lib/errors";
import { contentHash } from "@/lib/hash";
import {
  createSheet,
  diffRevisions,
  getRevision,
  getSheet,
  listProjectSheets,
  mySheets,
  reviewQueue,
  saveSheet,
  sheetHistory,
  STALE_SHEET_MESSAGE,
  transitionSheet,
} from "@/lib/sheets/service";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// Each test works in organisations of its own, so no table needs emptying.
const actorOf = (u: TestUser): Actor => ({ id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });

/** A wall-mounted 800 × 2000 × 600 mm enclosure with three 30 W breakers: valid for the enclosure-heat kind. */
const VALID = {
  width_m: 0.8,
  height_m: 2,
  depth_m: 0.6,
  installation: "wall",
  ambient_C: 35,
  targetInternal_C: 45,
  losses: [{ name: "Incomer MCCB", loss_W: 30, quantity: 3 }],
};
/** Height 9 m is outside the schema's 0.05–5 m. */
const INVALID = { ...VALID, height_m: 9 };

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
async function makeProject(organisationId: number, userId: number): Promise<number> {
  const [row] = await db()
    .insert(projects)
    .values({
      organisationId,
      code: `SH-${++seq}`,
      name: `Switchboard ${seq}`,
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
  return row!.id;
}

interface World {
  orgId: number;
  eng: Actor;
  eng2: Actor;
  lead: Actor;
  lead2: Actor;
  admin: Actor;
  viewer: Actor;
  projectId: number;
}

async function world(scheme: "letter" | "number" = "letter"): Promise<World> {
  const org = await makeOrg("Sheet Works");
  if (scheme !== "letter") await db().update(organisations).set({ revisionScheme: scheme }).where(eq(organisations.id, org.id));
  const [eng, eng2, lead, lead2, admin, viewer] = await Promise.all(
    (["engineer", "engineer", "lead", "lead", "admin", "viewer"] as const).map((r) => makeUser(org.id, r)),
  );
  const projectId = await makeProject(org.id, eng!.id);
  return {
    orgId: org.id,
    eng: actorOf(eng!),
    eng2: actorOf(eng2!),
    lead: actorOf(lead!),
    lead2: actorOf(lead2!),
    admin: actorOf(admin!),
    viewer: actorOf(viewer!),
    projectId,
  };
}

const tag = () => `EH-${++seq}`;

async function revisionsOf(sheetId: number) {
  return db().select().from(sheetRevisions).where(eq(sheetRevisions.sheetId, sheetId)).orderBy(sheetRevisions.ordinal);
}
async function versionOf(sheetId: number) {
  const [s] = await db().select({ version: sheets.version }).from(sheets).where(eq(sheets.id, sheetId));
  return s!.version;
}

afterAll(async () => {
  await closeDb();
});

describe("createSheet", () => {
  let w: World;
  beforeAll(async () => {
    w = await world();
  });

  it("stores a draft revision A with results computed on the server, hashed, and an audit event", async () => {
    const t = tag();
    const r = await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: t, title: "Enclosure heat, MCC-1", inputs: VALID });
    expect(r.revision).toMatchObject({ ordinal: 0, label: "A", status: "draft" });
    expect(r.version).toBe(1);
    expect(r.inputErrors).toBeNull();

    const expected = runCalc("enclosure-heat", VALID);
    expect(expected.ok).toBe(true);
    const [rev] = await revisionsOf(r.sheetId);
    expect(rev!.status).toBe("draft");
    expect(rev!.authorId).toBe(w.eng.id);
    expect(rev!.inputs).toEqual(VALID);
    expect(rev!.results).toEqual(JSON.parse(JSON.stringify(expected.ok ? expected.result : null)));
    expect(rev!.engineVersion).toBe(ENGINE_VERSION);
    expect(rev!.contentHash).toBe(contentHash(rev!.inputs, rev!.results, ENGINE_VERSION));

    const events = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "sheet"), eq(auditEvents.entityId, r.sheetId)));
    expect(events.map((e) => e.event)).toEqual(["sheet.created"]);
    expect(events[0]!.details).toMatchObject({ tag: t, kind: "enclosure-heat", label: "A" });
  });

  it("labels the first revision 0 for an organisation using numbers", async () => {
    const wn = await world("number");
    const r = await createSheet(wn.eng, { projectId: wn.projectId, kind: "enclosure-heat", tag: tag(), title: "Heat", inputs: VALID });
    expect(r.revision.label).toBe("0");
  });

  it("keeps invalid draft inputs as typed, with null results and the field errors returned", async () => {
    const r = await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: tag(), title: "Tall one", inputs: INVALID });
    expect(r.results).toBeNull();
    expect(r.inputErrors?.height_m).toBe("Enclosure height must be from 0.05 to 5 m");
    const [rev] = await revisionsOf(r.sheetId);
    expect(rev!.inputs).toEqual(INVALID);
    expect(rev!.results).toBeNull();
    const detail = await getSheet(w.eng, r.sheetId);
    expect(detail.currentInputErrors?.height_m).toBe("Enclosure height must be from 0.05 to 5 m");
  });

  it("refuses a tag already used in the project (field error), an unknown kind, and bad fields", async () => {
    const t = tag();
    await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: t, title: "First", inputs: VALID });
    const dup = await caught(createSheet(w.eng2, { projectId: w.projectId, kind: "enclosure-heat", tag: t.toLowerCase(), title: "Second", inputs: VALID }));
    expect(dup.status).toBe(400);
    expect(dup.fields?.tag).toMatch(/already used in this project/);

    const kind = await caught(createSheet(w.eng, { projectId: w.projectId, kind: "perpetual-motion", tag: tag(), title: "x", inputs: {} }));
    expect(kind.status).toBe(400);
    expect(kind.fields?.kind).toMatch(/^Kind must be one of: .*enclosure-heat/);

    const bad = await caught(createSheet(w.eng, { projectId: "abc", kind: "enclosure-heat", tag: "", title: "x".repeat(201), inputs: [1, 2] }));
    expect(bad.fields).toMatchObject({
      projectId: "Project must be a whole number from 1",
      tag: "Tag is required (1 to 40 characters)",
      title: "Title must be at most 200 characters",
    });
    expect(bad.fields?.inputs).toBeDefined();
  });

  it("lets only engineers and leads create; admins and viewers get 403", async () => {
    for (const a of [w.admin, w.viewer]) {
      const e = await caught(createSheet(a, { projectId: w.projectId, kind: "enclosure-heat", tag: tag(), title: "x", inputs: VALID }));
      expect(e.status).toBe(403);
    }
    await expect(createSheet(w.lead, { projectId: w.projectId, kind: "fault-withstand", tag: tag(), title: "Lead's own", inputs: {} })).resolves.toMatchObject({
      revision: { status: "draft" },
    });
  });

  it("refuses to add a sheet to an archived project (409)", async () => {
    const pid = await makeProject(w.orgId, w.eng.id);
    await db().update(projects).set({ archivedAt: new Date() }).where(eq(projects.id, pid));
    const e = await caught(createSheet(w.eng, { projectId: pid, kind: "enclosure-heat", tag: tag(), title: "x", inputs: VALID }));
    expect(e.status).toBe(409);
  });
});

describe("saveSheet", () => {
  let w: World;
  beforeAll(async () => {
    w = await world();
  });

  const create = (a: Actor, inputs: Record<string, unknown> = VALID) =>
    createSheet(a, { projectId: w.projectId, kind: "enclosure-heat", tag: tag(), title: "Heat budget", inputs });

  it("edits a draft in place, recomputes results and hash, bumps the version", async () => {
    const c = await create(w.eng, INVALID);
    const r = await saveSheet(w.eng, { sheetId: c.sheetId, version: c.version, inputs: VALID, title: "Heat budget, rev 2" });
    expect(r).toMatchObject({ version: 2, newRevision: false, inputErrors: null, revision: { ordinal: 0, label: "A", status: "draft" } });
    const revs = await revisionsOf(c.sheetId);
    expect(revs).toHaveLength(1);
    expect(revs[0]!.inputs).toEqual(VALID);
    expect(revs[0]!.results).not.toBeNull();
    expect(revs[0]!.contentHash).toBe(contentHash(VALID, revs[0]!.results, ENGINE_VERSION));
    const [s] = await db().select().from(sheets).where(eq(sheets.id, c.sheetId));
    expect(s).toMatchObject({ version: 2, title: "Heat budget, rev 2" });
  });

  it("refuses a save from a stale version with 409 and changes nothing", async () => {
    const c = await create(w.eng);
    await saveSheet(w.eng, { sheetId: c.sheetId, version: 1, inputs: { ...VALID, ambient_C: 30 } });
    const e = await caught(saveSheet(w.eng, { sheetId: c.sheetId, version: 1, inputs: { ...VALID, ambient_C: 20 } }));
    expect(e.status).toBe(409);
    expect(e.message).toBe(STALE_SHEET_MESSAGE);
    expect((await revisionsOf(c.sheetId))[0]!.inputs).toMatchObject({ ambient_C: 30 });
    expect(await versionOf(c.sheetId)).toBe(2);
  });

  it("lets exactly one of two concurrent saves from the same version win; the other gets 409", async () => {
    for (let round = 0; round < 3; round++) {
      const c = await create(w.eng);
      const a = { ...VALID, ambient_C: 25 };
      const b = { ...VALID, ambient_C: 30 };
      const outcomes = await Promise.allSettled([
        saveSheet(w.eng, { sheetId: c.sheetId, version: c.version, inputs: a }),
        saveSheet(w.eng, { sheetId: c.sheetId, version: c.version, inputs: b }),
      ]);
      const won = outcomes.filter((o) => o.status === "fulfilled");
      const lost = outcomes.filter((o) => o.status === "rejected");
      expect(won).toHaveLength(1);
      expect(lost).toHaveLength(1);
      const err = (lost[0] as PromiseRejectedResult).reason as AppError;
      expect(err).toBeInstanceOf(AppError);
      expect(err.status).toBe(409);
      expect(err.message).toBe(STALE_SHEET_MESSAGE);
      const winner = outcomes[0]!.status === "fulfilled" ? a : b;
      expect((await revisionsOf(c.sheetId))[0]!.inputs).toEqual(winner);
      expect(await versionOf(c.sheetId)).toBe(2);
      const saves = await db().select().from(auditEvents).where(and(eq(auditEvents.entityId, c.sheetId), eq(auditEvents.event, "sheet.saved")));
      expect(saves).toHaveLength(1);
    }
  });

  it("refuses edits while in review (409) and by someone other than the draft's author (403)", async () => {
    const c = await create(w.eng);
    const other = await caught(saveSheet(w.eng2, { sheetId: c.sheetId, version: 1, inputs: VALID }));
    expect(other.status).toBe(403);
    const otherLead = await caught(saveSheet(w.lead, { sheetId: c.sheetId, version: 1, inputs: VALID }));
    expect(otherLead.status).toBe(403);
    const t = await transitionSheet(w.eng, { sheetId: c.sheetId, version: 1, transition: "submit" });
    const e = await caught(saveSheet(w.eng, { sheetId: c.sheetId, version: t.version, inputs: { ...VALID, ambient_C: 20 } }));
    expect(e.status).toBe(409);
    expect(e.message).toMatch(/withdraw it before editing/);
    expect(await versionOf(c.sheetId)).toBe(t.version);
    for (const a of [w.viewer, w.admin]) expect((await caught(saveSheet(a, { sheetId: c.sheetId, version: t.version, inputs: VALID }))).status).toBe(403);
  });

  it("validates its request: 400 naming the fields", async () => {
    const e = await caught(saveSheet(w.eng, { sheetId: 0, version: "x", inputs: "not an object" }));
    expect(e.status).toBe(400);
    expect(Object.keys(e.fields ?? {}).sort()).toEqual(["inputs", "sheetId", "version"]);
  });
});

describe("reads", () => {
  let w: World;
  let sheetA: number;
  let sheetB: number;
  beforeAll(async () => {
    w = await world();
    const a = await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: "EH-A", title: "Enclosure A", inputs: VALID });
    sheetA = a.sheetId;
    const sub = await transitionSheet(w.eng, { sheetId: sheetA, version: a.version, transition: "submit" });
    const ap = await transitionSheet(w.lead, { sheetId: sheetA, version: sub.version, transition: "approve", comment: "Checked against the losses list" });
    await saveSheet(w.eng, { sheetId: sheetA, version: ap.version, inputs: { ...VALID, losses: [{ name: "Incomer MCCB", loss_W: 45, quantity: 3 }] } });
    const b = await createSheet(w.lead, { projectId: w.projectId, kind: "enclosure-heat", tag: "EH-B", title: "Enclosure B", inputs: VALID });
    sheetB = b.sheetId;
    await transitionSheet(w.lead, { sheetId: sheetB, version: b.version, transition: "submit" });
  });

  it("getSheet returns every revision with names and dates, the current content and the one in force", async () => {
    const d = await getSheet(w.viewer, String(sheetA));
    expect(d).toMatchObject({ id: sheetA, projectId: w.projectId, tag: "EH-A", kind: "enclosure-heat", kindTitle: "Enclosure heat budget", version: 4 });
    expect(d.revisions.map((r) => [r.label, r.status, r.authorName, r.checkedByName])).toEqual([
      ["A", "approved", w.eng.name, w.lead.name],
      ["B", "draft", w.eng.name, null],
    ]);
    expect(d.revisions[0]!.decidedAt).toBeInstanceOf(Date);
    expect(d.revisions[0]!.submittedAt).toBeInstanceOf(Date);
    expect(d.revisions[0]!.reviewComment).toBe("Checked against the losses list");
    expect(d.current.label).toBe("B");
    expect(d.current.inputs).toMatchObject({ losses: [{ loss_W: 45 }] });
    expect(d.approved?.label).toBe("A");
    expect(d.currentInputErrors).toBeNull();
  });

  it("listProjectSheets describes each sheet by its latest revision", async () => {
    const rows = await listProjectSheets(w.viewer, w.projectId);
    expect(rows.map((r) => [r.tag, r.kind, r.label, r.status, r.authorName, r.approvedLabel])).toEqual([
      ["EH-A", "enclosure-heat", "B", "draft", w.eng.name, "A"],
      ["EH-B", "enclosure-heat", "A", "in_review", w.lead.name, null],
    ]);
    expect(rows[0]!.updatedAt).toBeInstanceOf(Date);
  });

  it("reviewQueue lists revisions in review, never the lead's own", async () => {
    expect((await reviewQueue(w.lead)).map((r) => r.id)).not.toContain(sheetB);
    const q2 = await reviewQueue(w.lead2);
    expect(q2.map((r) => [r.id, r.label, r.authorName, r.projectName])).toEqual([[sheetB, "A", w.lead.name, expect.stringMatching(/^Switchboard/)]]);
  });

  it("mySheets lists the sheets whose latest revision the actor authored", async () => {
    expect((await mySheets(w.eng)).map((r) => r.id)).toEqual([sheetA]);
    expect((await mySheets(w.lead)).map((r) => r.id)).toEqual([sheetB]);
    expect(await mySheets(w.viewer)).toEqual([]);
  });

  it("getRevision returns one revision's content; an unknown ordinal is 404", async () => {
    const a = await getRevision(w.viewer, sheetA, 0);
    expect(a).toMatchObject({ label: "A", status: "approved", inputs: VALID });
    expect(a.results).toMatchObject({ kind: "enclosure-heat" });
    expect((await caught(getRevision(w.viewer, sheetA, 7))).status).toBe(404);
    expect((await caught(getRevision(w.viewer, sheetA, -1))).status).toBe(400);
  });

  it("diffRevisions names the changed input paths and result quantities", async () => {
    const d = await diffRevisions(w.viewer, sheetA, 0, 1);
    expect(d.from.label).toBe("A");
    expect(d.to.label).toBe("B");
    expect(d.inputs).toEqual([{ path: "losses.0.loss_W", kind: "changed", from: 30, to: 45 }]);
    const paths = d.results.map((c) => c.path);
    expect(paths).toContain("results.totalLoss_W");
    expect(paths).toContain("intermediates.P.value");
    expect(d.results.find((c) => c.path === "results.totalLoss_W")).toMatchObject({ from: 90, to: 135 });
    expect(paths.every((p) => /^(results|intermediates|checks|warnings)\./.test(p))).toBe(true);
    expect(await diffRevisions(w.viewer, sheetA, 1, 1)).toMatchObject({ inputs: [], results: [] });
  });

  it("sheetHistory keeps the review comments in order", async () => {
    const h = await sheetHistory(w.viewer, sheetA);
    expect(h.map((e) => e.event)).toEqual(["sheet.created", "sheet.submitted", "sheet.approved", "sheet.revised"]);
    expect(h[2]).toMatchObject({ actorName: w.lead.name, label: "A", comment: "Checked against the losses list" });
  });
});

describe("tenant isolation", () => {
  it("another organisation's sheet or project is 404 for every function", async () => {
    const home = await world();
    const away = await world();
    const c = await createSheet(home.eng, { projectId: home.projectId, kind: "enclosure-heat", tag: "EH-1", title: "Home", inputs: VALID });
    const s = await transitionSheet(home.eng, { sheetId: c.sheetId, version: c.version, transition: "submit" });

    const calls: [string, () => Promise<unknown>][] = [
      ["createSheet", () => createSheet(away.eng, { projectId: home.projectId, kind: "enclosure-heat", tag: "X-1", title: "x", inputs: VALID })],
      ["saveSheet", () => saveSheet(away.eng, { sheetId: c.sheetId, version: s.version, inputs: VALID })],
      ["withdraw", () => transitionSheet(away.eng, { sheetId: c.sheetId, version: s.version, transition: "withdraw" })],
      ["approve", () => transitionSheet(away.lead, { sheetId: c.sheetId, version: s.version, transition: "approve" })],
      ["return", () => transitionSheet(away.lead, { sheetId: c.sheetId, version: s.version, transition: "return", comment: "No" })],
      ["getSheet", () => getSheet(away.viewer, c.sheetId)],
      ["listProjectSheets", () => listProjectSheets(away.viewer, home.projectId)],
      ["getRevision", () => getRevision(away.viewer, c.sheetId, 0)],
      ["diffRevisions", () => diffRevisions(away.viewer, c.sheetId, 0, 0)],
      ["sheetHistory", () => sheetHistory(away.viewer, c.sheetId)],
    ];
    for (const [name, p] of calls) {
      const e = await caught(p());
      expect([name, e.status]).toEqual([name, 404]);
    }
    expect((await reviewQueue(away.lead)).map((r) => r.id)).not.toContain(c.sheetId);
    expect(await listProjectSheets(away.viewer, away.projectId)).toEqual([]);

    // Nothing of the home sheet changed.
    const [rev] = await revisionsOf(c.sheetId);
    expect(rev!.status).toBe("in_review");
    expect(await versionOf(c.sheetId)).toBe(s.version);
  });
});
