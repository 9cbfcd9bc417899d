import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { auditEvents, mailOutbox, projects, sheetRevisions, sheets, SHEET_STATUSES, type SheetStatus } from "@/db/schema";
import type { Actor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { createSheet, getSheet, saveSheet, sheetHistory, transitionSheet } from "@/lib/sheets/service";
import { TRANSITION_NAMES, transitionAllowed, type TransitionName } from "@/lib/sheets/workflow";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// Each test works in organisations of its own, so no table needs emptying.
const actorOf = (u: TestUser): Actor => ({ id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });

/** Fault withstand of a 2 × 80 × 10 mm copper bar pack at 50 kA for 1 s: valid for the fault-withstand kind. */
const VALID_FAULT = {
  I_kA: 50,
  t_s: 1,
  materialId: "cu-etp",
  conductor: { type: "bars", arrangement: { barWidth_m: 0.08, barThickness_m: 0.01, barsPerPhase: 2, gap_m: 0.01, phases: 3, phaseSpacing_m: 0.15, orientation: "edge" } },
  span_m: 0.5,
};
/** A wall-mounted enclosure with three 30 W breakers: valid for the enclosure-heat kind. */
const VALID = {
  width_m: 0.8,
  height_m: 2,
  depth_m: 0.6,
  installation: "wall",
  ambient_C: 35,
  targetInternal_C: 45,
  losses: [{ name: "Incomer MCCB", loss_W: 30, quantity: 3 }],
};
/** Width 0 m is below the schema's 0.05 m. */
const INVALID = { ...VALID, width_m: 0 };
const COMMENT = "Check the gap to the door: losses of the contactors are missing";

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
interface World {
  orgId: number;
  projectId: number;
  eng: Actor;
  eng2: Actor;
  lead: Actor;
  lead2: Actor;
  admin: Actor;
  viewer: Actor;
}

async function world(): Promise<World> {
  const org = await makeOrg("Review Works");
  const users = await Promise.all((["engineer", "engineer", "lead", "lead", "admin", "viewer"] as const).map((r) => makeUser(org.id, r)));
  const [eng, eng2, lead, lead2, admin, viewer] = users.map(actorOf) as [Actor, Actor, Actor, Actor, Actor, Actor];
  const [p] = await db()
    .insert(projects)
    .values({
      organisationId: org.id,
      code: `RW-${++seq}`,
      name: `Motor control centre ${seq}`,
      systemVoltage: 400,
      systemType: "3ph-4w",
      frequency: 50,
      earthing: "TN-S",
      designAmbient: 35,
      standardFamily: "iec",
      unitSystem: "metric",
      createdById: eng.id,
    })
    .$returningId();
  return { orgId: org.id, projectId: p!.id, eng, eng2, lead, lead2, admin, viewer };
}

async function latest(sheetId: number) {
  const revs = await db().select().from(sheetRevisions).where(eq(sheetRevisions.sheetId, sheetId)).orderBy(sheetRevisions.ordinal);
  return { revs, last: revs[revs.length - 1]! };
}
async function versionOf(sheetId: number) {
  const [s] = await db().select({ version: sheets.version }).from(sheets).where(eq(sheets.id, sheetId));
  return s!.version;
}
async function auditOf(sheetId: number) {
  return db()
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.entityType, "sheet"), eq(auditEvents.entityId, sheetId)))
    .orderBy(auditEvents.id);
}
async function outboxOf(orgId: number) {
  return db().select().from(mailOutbox).where(eq(mailOutbox.organisationId, orgId)).orderBy(mailOutbox.id);
}
const link = (projectId: number, sheetId: number) => new URL(`/projects/${projectId}/sheets/${sheetId}`, env().APP_URL).toString();

/**
 * A sheet authored by `author` whose latest revision is in `state`, built through the
 * service (a latest revision is never superseded in normal use; that state is set directly).
 */
async function sheetIn(w: World, author: Actor, reviewer: Actor, state: SheetStatus): Promise<{ sheetId: number; version: number }> {
  const c = await createSheet(author, { projectId: w.projectId, kind: "enclosure-heat", tag: `EH-${++seq}`, title: "Heat budget", inputs: VALID });
  let version = c.version;
  const step = async (a: Actor, transition: TransitionName, comment?: string) => {
    version = (await transitionSheet(a, { sheetId: c.sheetId, version, transition, comment })).version;
  };
  if (state === "draft") return { sheetId: c.sheetId, version };
  await step(author, "submit");
  if (state === "in_review") return { sheetId: c.sheetId, version };
  if (state === "returned") {
    await step(reviewer, "return", COMMENT);
    return { sheetId: c.sheetId, version };
  }
  await step(reviewer, "approve");
  if (state === "superseded") await db().update(sheetRevisions).set({ status: "superseded" }).where(eq(sheetRevisions.sheetId, c.sheetId));
  return { sheetId: c.sheetId, version };
}

afterAll(async () => {
  await closeDb();
});

describe("every transition rule, against the database", () => {
  let w: World;
  beforeAll(async () => {
    w = await world();
  });

  // Authors: an engineer and a lead. Actors: both authors, another engineer, another lead, an admin, a viewer.
  const authors = ["eng", "lead"] as const;
  for (const authorKey of authors) {
    for (const state of SHEET_STATUSES) {
      it(`author ${authorKey}, latest revision ${state}: each role × transition matches transitionAllowed`, async () => {
        const author = w[authorKey];
        const reviewer = authorKey === "lead" ? w.lead2 : w.lead;
        const actors = [w.eng, w.eng2, w.lead, w.lead2, w.admin, w.viewer];
        let fixture = await sheetIn(w, author, reviewer, state);
        let checked = 0;
        let allowed = 0;
        for (const transition of TRANSITION_NAMES) {
          for (const actor of actors) {
            const expected = transitionAllowed(transition, { status: state, role: actor.role, actorId: actor.id, authorId: author.id, comment: COMMENT });
            const before = await latest(fixture.sheetId);
            const auditBefore = (await auditOf(fixture.sheetId)).length;
            const call = transitionSheet(actor, { sheetId: fixture.sheetId, version: fixture.version, transition, comment: COMMENT });
            const label = `${actor.role}${actor.id === author.id ? " (author)" : ""} ${transition} from ${state}`;
            if (expected.ok) {
              const r = await call;
              expect([label, r.revision.status]).toEqual([label, expected.to]);
              const after = await latest(fixture.sheetId);
              expect([label, after.last.status]).toEqual([label, expected.to]);
              expect(await versionOf(fixture.sheetId)).toBe(fixture.version + 1);
              expect((await auditOf(fixture.sheetId)).length).toBeGreaterThan(auditBefore);
              fixture = await sheetIn(w, author, reviewer, state);
              allowed++;
            } else {
              const e = await caught(call);
              expect([label, [400, 403, 409].includes(e.status)]).toEqual([label, true]);
              // The role's permission is checked first (generic 403); every other refusal carries the workflow's reason.
              const permitted = can(actor.role, transition === "approve" || transition === "return" ? "sheet.review" : "sheet.submit");
              expect([label, e.message]).toEqual([label, permitted ? expected.reason : "Your role does not allow this"]);
              const after = await latest(fixture.sheetId);
              expect([label, after.revs]).toEqual([label, before.revs]);
              expect(await versionOf(fixture.sheetId)).toBe(fixture.version);
              expect((await auditOf(fixture.sheetId)).length).toBe(auditBefore);
            }
            checked++;
          }
        }
        expect(checked).toBe(TRANSITION_NAMES.length * actors.length);
        // Something can always happen to a draft, a returned or an in-review revision; nothing to an approved or superseded one.
        expect(allowed > 0).toBe(state === "draft" || state === "returned" || state === "in_review");
      });
    }
  }

  it("maps refusals to 409 for the state, 403 for the person, 400 for a missing comment", async () => {
    const draft = await sheetIn(w, w.eng, w.lead, "draft");
    expect((await caught(transitionSheet(w.lead, { ...draft, transition: "approve" }))).status).toBe(409);
    const review = await sheetIn(w, w.eng, w.lead, "in_review");
    expect((await caught(transitionSheet(w.eng2, { ...review, transition: "withdraw" }))).status).toBe(403);
    expect((await caught(transitionSheet(w.eng, { ...review, transition: "approve" }))).status).toBe(403);
    const noComment = await caught(transitionSheet(w.lead, { ...review, transition: "return", comment: "   " }));
    expect(noComment.status).toBe(400);
    expect(noComment.fields?.comment).toMatch(/comment is required/);
    const stale = await caught(transitionSheet(w.lead, { ...review, version: review.version - 1, transition: "approve" }));
    expect(stale.status).toBe(409);
    expect(stale.message).toMatch(/Someone else saved this sheet/);
  });
});

describe("four eyes", () => {
  it("a lead cannot approve or return their own sheet; another lead can", async () => {
    const w = await world();
    const s = await sheetIn(w, w.lead, w.lead2, "in_review");
    const own = await caught(transitionSheet(w.lead, { ...s, transition: "approve" }));
    expect(own.status).toBe(403);
    expect(own.message).toMatch(/cannot check and approve their own sheet/);
    expect((await caught(transitionSheet(w.lead, { ...s, transition: "return", comment: COMMENT }))).status).toBe(403);
    expect((await latest(s.sheetId)).last.status).toBe("in_review");

    const r = await transitionSheet(w.lead2, { ...s, transition: "approve" });
    expect(r.revision.status).toBe("approved");
    const { last } = await latest(s.sheetId);
    expect(last.checkedById).toBe(w.lead2.id);
    expect(last.decidedAt).toBeInstanceOf(Date);
  });

  it("a lead who starts a new revision of an approved sheet becomes its author and cannot approve it", async () => {
    const w = await world();
    const s = await sheetIn(w, w.eng, w.lead, "approved");
    const saved = await saveSheet(w.lead, { sheetId: s.sheetId, version: s.version, inputs: { ...VALID, ambient_C: 30 } });
    expect(saved.newRevision).toBe(true);
    const sub = await transitionSheet(w.lead, { sheetId: s.sheetId, version: saved.version, transition: "submit" });
    expect((await caught(transitionSheet(w.lead, { sheetId: s.sheetId, version: sub.version, transition: "approve" }))).status).toBe(403);
    await expect(transitionSheet(w.lead2, { sheetId: s.sheetId, version: sub.version, transition: "approve" })).resolves.toMatchObject({ superseded: ["A"] });
  });
});

describe("supersession", () => {
  it("editing an approved revision starts a draft; the approved one stays as it was until the new one is approved", async () => {
    const w = await world();
    const c = await createSheet(w.eng, { projectId: w.projectId, kind: "fault-withstand", tag: "FW-1", title: "Main busbar withstand", inputs: VALID_FAULT });
    expect(c.inputErrors).toBeNull();
    const sub = await transitionSheet(w.eng, { sheetId: c.sheetId, version: c.version, transition: "submit" });
    const ap = await transitionSheet(w.lead, { sheetId: c.sheetId, version: sub.version, transition: "approve" });
    const approvedA = (await latest(c.sheetId)).last;
    expect(approvedA).toMatchObject({ label: "A", status: "approved", checkedById: w.lead.id });

    // Saving the same inputs again changes no revision.
    const same = await saveSheet(w.eng, { sheetId: c.sheetId, version: ap.version, inputs: VALID_FAULT });
    expect(same.newRevision).toBe(false);
    expect((await latest(c.sheetId)).revs).toHaveLength(1);

    const edit = await saveSheet(w.eng, { sheetId: c.sheetId, version: same.version, inputs: { ...VALID_FAULT, I_kA: 65 } });
    expect(edit).toMatchObject({ newRevision: true, revision: { ordinal: 1, label: "B", status: "draft" } });
    const afterEdit = await latest(c.sheetId);
    expect(afterEdit.revs).toHaveLength(2);
    expect(afterEdit.revs[0]).toEqual(approvedA);
    expect(afterEdit.revs[1]).toMatchObject({ label: "B", status: "draft", authorId: w.eng.id, checkedById: null });
    expect(afterEdit.revs[1]!.inputs).toMatchObject({ I_kA: 65 });
    expect(afterEdit.revs[1]!.contentHash).not.toBe(approvedA.contentHash);
    expect((await getSheet(w.viewer, c.sheetId)).approved?.label).toBe("A");

    // A second edit changes B in place; A is still untouched.
    const edit2 = await saveSheet(w.eng, { sheetId: c.sheetId, version: edit.version, inputs: { ...VALID_FAULT, I_kA: 63 } });
    expect(edit2).toMatchObject({ newRevision: false, revision: { label: "B" } });
    expect((await latest(c.sheetId)).revs[0]).toEqual(approvedA);

    const subB = await transitionSheet(w.eng, { sheetId: c.sheetId, version: edit2.version, transition: "submit" });
    expect((await latest(c.sheetId)).revs[0]).toEqual(approvedA);
    const apB = await transitionSheet(w.lead2, { sheetId: c.sheetId, version: subB.version, transition: "approve" });
    expect(apB.superseded).toEqual(["A"]);
    const done = await latest(c.sheetId);
    expect(done.revs.map((r) => [r.label, r.status])).toEqual([
      ["A", "superseded"],
      ["B", "approved"],
    ]);
    const { status: _s, updatedAt: _u, ...aBefore } = approvedA;
    const { status: _s2, updatedAt: _u2, ...aAfter } = done.revs[0]!;
    expect(aAfter).toEqual(aBefore);

    const events = await auditOf(c.sheetId);
    const sup = events.filter((e) => e.event === "sheet.superseded");
    expect(sup).toHaveLength(1);
    expect(sup[0]!.details).toMatchObject({ label: "A", supersededBy: { label: "B" } });
    expect(events.map((e) => e.event)).toEqual([
      "sheet.created",
      "sheet.submitted",
      "sheet.approved",
      "sheet.revised",
      "sheet.saved",
      "sheet.submitted",
      "sheet.approved",
      "sheet.superseded",
    ]);
  });
});

describe("invalid inputs", () => {
  it("a draft with invalid inputs is stored but cannot be submitted (400 naming the field)", async () => {
    const w = await world();
    const c = await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: "EH-X", title: "Bad width", inputs: INVALID });
    expect(c.inputErrors?.width_m).toBe("Enclosure width must be from 0.05 to 50 m");
    const e = await caught(transitionSheet(w.eng, { sheetId: c.sheetId, version: c.version, transition: "submit" }));
    expect(e.status).toBe(400);
    expect(e.fields?.width_m).toBe("Enclosure width must be from 0.05 to 50 m");
    expect((await latest(c.sheetId)).last.status).toBe("draft");
    expect(await versionOf(c.sheetId)).toBe(c.version);
    expect((await auditOf(c.sheetId)).map((a) => a.event)).toEqual(["sheet.created"]);
    expect(await outboxOf(w.orgId)).toEqual([]);

    const fixed = await saveSheet(w.eng, { sheetId: c.sheetId, version: c.version, inputs: VALID });
    await expect(transitionSheet(w.eng, { sheetId: c.sheetId, version: fixed.version, transition: "submit" })).resolves.toMatchObject({ revision: { status: "in_review" } });
  });
});

describe("atomicity: the change, its audit events and its mail commit together", () => {
  it("a return refused after the version update (blank comment) leaves nothing behind", async () => {
    const w = await world();
    const s = await sheetIn(w, w.eng, w.lead, "in_review");
    const before = await latest(s.sheetId);
    const auditBefore = await auditOf(s.sheetId);
    const mailBefore = await outboxOf(w.orgId);
    const e = await caught(transitionSheet(w.lead, { ...s, transition: "return", comment: " \n " }));
    expect(e.status).toBe(400);
    expect((await latest(s.sheetId)).revs).toEqual(before.revs);
    expect(await versionOf(s.sheetId)).toBe(s.version);
    expect(await auditOf(s.sheetId)).toEqual(auditBefore);
    expect(await outboxOf(w.orgId)).toEqual(mailBefore);
  });

  it("a failure while queueing the mail rolls back the status change, the audit event and the mail already queued", async () => {
    const w = await world();
    // A lead created after the healthy ones, whose address the outbox rejects (line break).
    await makeUser(w.orgId, "lead", { email: `broken\nlead-${Date.now()}@example.test` });
    const c = await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: "EH-M", title: "Mail fails", inputs: VALID });
    await expect(transitionSheet(w.eng, { sheetId: c.sheetId, version: c.version, transition: "submit" })).rejects.toThrow(/invalid recipient/);
    expect((await latest(c.sheetId)).last).toMatchObject({ status: "draft", submittedAt: null });
    expect(await versionOf(c.sheetId)).toBe(c.version);
    expect((await auditOf(c.sheetId)).map((a) => a.event)).toEqual(["sheet.created"]);
    expect(await outboxOf(w.orgId)).toEqual([]);
  });
});

describe("notifications", () => {
  let w: World;
  beforeAll(async () => {
    w = await world();
  });

  it("submit asks every active lead except the author; approve and return tell the author, with a link to the sheet", async () => {
    const inactive = await makeUser(w.orgId, "lead", { status: "deactivated" });
    const c = await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: "EH-N", title: "Panel heat", inputs: VALID });
    const url = link(w.projectId, c.sheetId);

    const sub = await transitionSheet(w.eng, { sheetId: c.sheetId, version: c.version, transition: "submit" });
    expect(sub.notified.sort()).toEqual([w.lead.email, w.lead2.email].sort());
    let mail = await outboxOf(w.orgId);
    expect(mail.map((m) => m.toAddress).sort()).toEqual([w.lead.email, w.lead2.email].sort());
    expect(mail.map((m) => m.toAddress)).not.toContain(inactive.email);
    for (const m of mail) {
      expect(m.subject).toBe(`Review requested: EH-N rev A (${(await getSheet(w.eng, c.sheetId)).projectName})`);
      expect(m.textBody).toContain(url);
      expect(m.htmlBody).toContain(url);
      expect(m.textBody).toContain(w.eng.name);
    }

    const ret = await transitionSheet(w.lead2, { sheetId: c.sheetId, version: sub.version, transition: "return", comment: COMMENT });
    expect(ret.notified).toEqual([w.eng.email]);
    mail = await outboxOf(w.orgId);
    const returned = mail[mail.length - 1]!;
    expect(returned.toAddress).toBe(w.eng.email);
    expect(returned.subject).toMatch(/^Returned: EH-N rev A/);
    expect(returned.textBody).toContain(COMMENT);
    expect(returned.textBody).toContain(url);

    // Withdrawing sends nothing.
    const resub = await transitionSheet(w.eng, { sheetId: c.sheetId, version: ret.version, transition: "submit" });
    const count = (await outboxOf(w.orgId)).length;
    const wd = await transitionSheet(w.eng, { sheetId: c.sheetId, version: resub.version, transition: "withdraw" });
    expect(wd.notified).toEqual([]);
    expect((await outboxOf(w.orgId)).length).toBe(count);

    const resub2 = await transitionSheet(w.eng, { sheetId: c.sheetId, version: wd.version, transition: "submit" });
    const ap = await transitionSheet(w.lead, { sheetId: c.sheetId, version: resub2.version, transition: "approve" });
    expect(ap.notified).toEqual([w.eng.email]);
    mail = await outboxOf(w.orgId);
    const approved = mail[mail.length - 1]!;
    expect(approved).toMatchObject({ toAddress: w.eng.email, status: "pending" });
    expect(approved.subject).toMatch(/^Approved: EH-N rev A/);
    expect(approved.textBody).toContain(w.lead.name);
    expect(approved.textBody).toContain(url);
  });

  it("a lead's own submission goes to the other leads only", async () => {
    const c = await createSheet(w.lead, { projectId: w.projectId, kind: "enclosure-heat", tag: "EH-L", title: "Lead's", inputs: VALID });
    const before = (await outboxOf(w.orgId)).map((m) => m.id);
    await transitionSheet(w.lead, { sheetId: c.sheetId, version: c.version, transition: "submit" });
    const fresh = (await outboxOf(w.orgId)).filter((m) => !before.includes(m.id));
    expect(fresh.map((m) => m.toAddress)).toEqual([w.lead2.email]);
  });
});

describe("review history", () => {
  it("keeps each review comment on the revision and in the audit trail", async () => {
    const w = await world();
    const c = await createSheet(w.eng, { projectId: w.projectId, kind: "enclosure-heat", tag: "EH-H", title: "History", inputs: VALID });
    let v = (await transitionSheet(w.eng, { sheetId: c.sheetId, version: c.version, transition: "submit" })).version;
    v = (await transitionSheet(w.lead, { sheetId: c.sheetId, version: v, transition: "return", comment: COMMENT })).version;
    expect((await latest(c.sheetId)).last).toMatchObject({ status: "returned", reviewComment: COMMENT, checkedById: w.lead.id });

    // Editing a returned revision makes it a draft again; the comment stays for the author to read.
    const saved = await saveSheet(w.eng, { sheetId: c.sheetId, version: v, inputs: { ...VALID, losses: [...VALID.losses, { name: "Contactor", loss_W: 6, quantity: 4 }] } });
    expect(saved.revision).toMatchObject({ label: "A", status: "draft" });
    expect((await latest(c.sheetId)).last.reviewComment).toBe(COMMENT);

    v = (await transitionSheet(w.eng, { sheetId: c.sheetId, version: saved.version, transition: "submit" })).version;
    expect((await latest(c.sheetId)).last).toMatchObject({ status: "in_review", checkedById: null, decidedAt: null });
    await transitionSheet(w.lead2, { sheetId: c.sheetId, version: v, transition: "approve", comment: "Contactor losses now included" });

    const h = await sheetHistory(w.viewer, c.sheetId);
    expect(h.map((e) => [e.event, e.transition, e.label, e.comment])).toEqual([
      ["sheet.created", null, "A", null],
      ["sheet.submitted", "submit", "A", null],
      ["sheet.returned", "return", "A", COMMENT],
      ["sheet.saved", null, "A", null],
      ["sheet.submitted", "submit", "A", null],
      ["sheet.approved", "approve", "A", "Contactor losses now included"],
    ]);
    expect(h[2]!.actorName).toBe(w.lead.name);
    const rows = await db()
      .select({ event: auditEvents.event })
      .from(auditEvents)
      .where(and(eq(auditEvents.entityId, c.sheetId), inArray(auditEvents.event, ["sheet.returned", "sheet.approved"])));
    expect(rows).toHaveLength(2);
  });
});
