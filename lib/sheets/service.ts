import "server-only";
import { db, type Tx } from "@/db/client";
import type { AuditEvent, SheetStatus } from "@/db/schema";
import {
  bumpSheetVersion,
  findProject,
  findSheet,
  insertRevision,
  insertSheet,
  lockLatestRevision,
  lockOtherApprovedRevisions,
  nextSheetPosition,
  revisionSchemeOf,
  updateRevision,
  updateSheetTitle,
  type RevisionRow,
  type SheetProject,
  type SheetRow,
} from "@/db/queries/sheets";
import { audit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import type { Permission } from "@/lib/auth/roles";
import { ENGINE_VERSION, runCalc } from "@/lib/engine";
import { conflict, forbidden, isDuplicateKey, notFound, validationError } from "@/lib/errors";
import { canonicalJson, contentHash } from "@/lib/hash";
import { parseInput, PROJECT_NOT_FOUND, requirePermission, SHEET_NOT_FOUND, STALE_SHEET_MESSAGE } from "./common";
import { notifyApproved, notifyReturned, notifyReviewRequested, type SheetMailContext } from "./notifications";
import { revisionLabel } from "./revision-label";
import { createSheetSchema, saveSheetSchema, transitionSheetSchema } from "./schemas";
import { editAllowed, TRANSITIONS, transitionAllowed, type TransitionName } from "./workflow";

/**
 * The write side of calculation sheets: create, save, and move through review. Each
 * function takes the acting user first, validates its input with zod, and does all its
 * writes (the change, the audit event, the outbox mail) in one transaction.
 *
 * Results are always computed here on the server with `runCalc`. A draft may hold
 * inputs that do not validate yet: they are stored as typed, the results are null and
 * the field errors come back (`inputErrors`) for the form to show. Submitting re-runs
 * the calculation and refuses while any input is invalid.
 */

/** One import point for callers: the messages callers may match, and the read functions. */
export { STALE_SHEET_MESSAGE, SHEET_NOT_FOUND } from "./common";
export * from "./reads";

/** A revision as the write functions report it. */
export interface RevisionRef {
  id: number;
  ordinal: number;
  label: string;
  status: SheetStatus;
}

/** What `createSheet` and `saveSheet` return. */
export interface SheetWriteResult {
  sheetId: number;
  projectId: number;
  /** The sheet's new version: send it with the next save or transition. */
  version: number;
  /** The latest revision after the write. */
  revision: RevisionRef;
  /** True when the save started a new revision (the latest one was approved). */
  newRevision: boolean;
  /** The stored calculation result, or null while the inputs are invalid. */
  results: Record<string, unknown> | null;
  /** Field errors of the inputs ("losses.0.loss_W": message), or null when they are valid. */
  inputErrors: Record<string, string> | null;
}

/** What `transitionSheet` returns. */
export interface TransitionResult {
  sheetId: number;
  projectId: number;
  version: number;
  revision: RevisionRef;
  /** Labels of revisions this approval superseded. */
  superseded: string[];
  /** Addresses the transition's e-mails were queued for. */
  notified: string[];
}

/** JSON round trip: what the database will hand back, so hashes match the stored bytes. */
function asStoredJson<T>(v: T): T {
  return JSON.parse(JSON.stringify(v)) as T;
}

interface Computed {
  results: Record<string, unknown> | null;
  engineVersion: string;
  contentHash: string;
  inputErrors: Record<string, string> | null;
}

/** Runs the calculation and hashes inputs + results + engine version. */
function compute(kind: string, inputs: Record<string, unknown>): Computed {
  const outcome = runCalc(kind, inputs);
  const results = outcome.ok ? asStoredJson(outcome.result as unknown as Record<string, unknown>) : null;
  return {
    results,
    engineVersion: ENGINE_VERSION,
    contentHash: contentHash(inputs, results, ENGINE_VERSION),
    inputErrors: outcome.ok ? null : outcome.fields,
  };
}

/** Applies the optimistic lock; tells a stale version (409) from an unknown sheet (404). */
async function lockVersion(tx: Tx, actor: Actor, sheetId: number, version: number): Promise<{ sheet: SheetRow; version: number }> {
  const next = await bumpSheetVersion(tx, actor.organisationId, sheetId, version);
  const sheet = await findSheet(tx, actor.organisationId, sheetId);
  if (!sheet) throw notFound(SHEET_NOT_FOUND);
  if (next === null) throw conflict(STALE_SHEET_MESSAGE);
  return { sheet, version: next };
}

async function latestOf(tx: Tx, actor: Actor, sheetId: number): Promise<RevisionRow> {
  const latest = await lockLatestRevision(tx, actor.organisationId, sheetId);
  if (!latest) throw new Error(`sheet ${sheetId} has no revision`);
  return latest;
}

async function projectOf(tx: Tx, actor: Actor, projectId: number): Promise<SheetProject> {
  const project = await findProject(tx, actor.organisationId, projectId);
  if (!project) throw notFound(PROJECT_NOT_FOUND);
  return project;
}

const ref = (r: { id: number; ordinal: number; label: string }, status: SheetStatus): RevisionRef => ({ id: r.id, ordinal: r.ordinal, label: r.label, status });

/**
 * Adds a sheet of a calculation kind to a project, with its first revision (ordinal 0,
 * labelled by the organisation's scheme) as a draft. Needs `sheet.write`.
 * Errors: 403 role; 400 field errors (unknown kind, tag already used in the project, …);
 * 404 project not in the actor's organisation; 409 project archived.
 */
export async function createSheet(actor: Actor, raw: unknown): Promise<SheetWriteResult> {
  requirePermission(actor, "sheet.write");
  const input = parseInput(createSheetSchema, raw);
  const inputs = asStoredJson(input.inputs);
  const c = compute(input.kind, inputs);
  try {
    return await db().transaction(async (tx) => {
      const project = await projectOf(tx, actor, input.projectId);
      if (project.archivedAt) throw conflict("This project is archived; restore it before adding sheets");
      const scheme = await revisionSchemeOf(tx, actor.organisationId);
      const position = await nextSheetPosition(tx, actor.organisationId, project.id);
      const sheetId = await insertSheet(tx, {
        organisationId: actor.organisationId,
        projectId: project.id,
        kind: input.kind,
        tag: input.tag,
        title: input.title,
        position,
        createdById: actor.id,
      });
      const label = revisionLabel(0, scheme);
      const revisionId = await insertRevision(tx, {
        organisationId: actor.organisationId,
        sheetId,
        ordinal: 0,
        label,
        inputs,
        results: c.results,
        engineVersion: c.engineVersion,
        contentHash: c.contentHash,
        authorId: actor.id,
      });
      await audit(tx, {
        organisationId: actor.organisationId,
        actorId: actor.id,
        event: "sheet.created",
        entityType: "sheet",
        entityId: sheetId,
        details: { projectId: project.id, kind: input.kind, tag: input.tag, title: input.title, revisionId, ordinal: 0, label, valid: c.inputErrors === null },
      });
      return {
        sheetId,
        projectId: project.id,
        version: 1,
        revision: { id: revisionId, ordinal: 0, label, status: "draft" },
        newRevision: false,
        results: c.results,
        inputErrors: c.inputErrors,
      };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw validationError({ tag: `Tag ${input.tag} is already used in this project` }, "Tag is already used in this project");
    throw err;
  }
}

/**
 * Saves new inputs (and optionally a new title) against the version the client opened.
 * A draft or returned revision is edited in place by its author (returned becomes
 * draft); an approved latest revision stays untouched and a new draft revision (next
 * ordinal and label, authored by the actor) is created, unless the inputs are
 * identical to it; a revision in review must be withdrawn first. Results, engine
 * version and content hash are recomputed. Needs `sheet.write`.
 * Errors: 403 role or not the author; 400 field errors of the request; 404 sheet not
 * in the organisation; 409 stale version (STALE_SHEET_MESSAGE) or revision in review.
 */
export async function saveSheet(actor: Actor, raw: unknown): Promise<SheetWriteResult> {
  requirePermission(actor, "sheet.write");
  const input = parseInput(saveSheetSchema, raw);
  const inputs = asStoredJson(input.inputs);
  return db().transaction(async (tx) => {
    const { sheet, version } = await lockVersion(tx, actor, input.sheetId, input.version);
    const latest = await latestOf(tx, actor, sheet.id);
    const edit = editAllowed({ status: latest.status, actorId: actor.id, authorId: latest.authorId });
    if (!edit.ok) throw edit.kind === "status" ? conflict(edit.reason) : forbidden(edit.reason);

    const titleChanged = input.title !== undefined && input.title !== sheet.title;
    if (titleChanged) await updateSheetTitle(tx, actor.organisationId, sheet.id, input.title!);
    const titleDetails = titleChanged ? { title: { from: sheet.title, to: input.title } } : {};
    const c = compute(sheet.kind, inputs);
    const base = { organisationId: actor.organisationId, actorId: actor.id, entityType: "sheet", entityId: sheet.id } as const;

    if (edit.mode === "in_place") {
      await updateRevision(tx, actor.organisationId, latest.id, {
        status: "draft",
        inputs,
        results: c.results,
        engineVersion: c.engineVersion,
        contentHash: c.contentHash,
      });
      await audit(tx, {
        ...base,
        event: "sheet.saved",
        details: { revisionId: latest.id, ordinal: latest.ordinal, label: latest.label, from: latest.status, valid: c.inputErrors === null, ...titleDetails },
      });
      return { sheetId: sheet.id, projectId: sheet.projectId, version, revision: ref(latest, "draft"), newRevision: false, results: c.results, inputErrors: c.inputErrors };
    }

    // The latest revision is approved (locked). Same inputs: nothing to revise.
    if (canonicalJson(inputs) === canonicalJson(latest.inputs)) {
      if (titleChanged) await audit(tx, { ...base, event: "sheet.saved", details: { revisionId: latest.id, label: latest.label, ...titleDetails } });
      const stored = compute(sheet.kind, latest.inputs);
      return {
        sheetId: sheet.id,
        projectId: sheet.projectId,
        version,
        revision: ref(latest, latest.status),
        newRevision: false,
        results: latest.results ?? null,
        inputErrors: stored.inputErrors,
      };
    }
    const scheme = await revisionSchemeOf(tx, actor.organisationId);
    const ordinal = latest.ordinal + 1;
    const label = revisionLabel(ordinal, scheme);
    const revisionId = await insertRevision(tx, {
      organisationId: actor.organisationId,
      sheetId: sheet.id,
      ordinal,
      label,
      inputs,
      results: c.results,
      engineVersion: c.engineVersion,
      contentHash: c.contentHash,
      authorId: actor.id,
    });
    await audit(tx, {
      ...base,
      event: "sheet.revised",
      details: { revisionId, ordinal, label, basedOn: { revisionId: latest.id, label: latest.label }, valid: c.inputErrors === null, ...titleDetails },
    });
    return {
      sheetId: sheet.id,
      projectId: sheet.projectId,
      version,
      revision: { id: revisionId, ordinal, label, status: "draft" },
      newRevision: true,
      results: c.results,
      inputErrors: c.inputErrors,
    };
  });
}

/** The permission each transition needs on top of the workflow's own rules. */
const TRANSITION_PERMISSION: Record<TransitionName, Permission> = {
  submit: "sheet.submit",
  withdraw: "sheet.submit",
  approve: "sheet.review",
  return: "sheet.review",
};

/**
 * Audit event per transition. The schema's event list has no "withdrawn" entry, so a
 * withdrawal is recorded as a save with `details.transition = "withdraw"`.
 */
const TRANSITION_EVENT: Record<TransitionName, AuditEvent> = {
  submit: "sheet.submitted",
  withdraw: "sheet.withdrawn",
  approve: "sheet.approved",
  return: "sheet.returned",
};

/**
 * Maps a refusal of `transitionAllowed` to the error vocabulary: the decision and its
 * message are the workflow's; this only picks the HTTP status (role or person → 403,
 * state → 409, missing comment → 400 on the comment field).
 */
function refusal(name: TransitionName, ctx: { status: SheetStatus; role: Actor["role"]; actorId: number; authorId: number }, reason: string) {
  const t = TRANSITIONS[name];
  if (!(t.roles as readonly string[]).includes(ctx.role)) return forbidden(reason);
  if (!(t.from as readonly SheetStatus[]).includes(ctx.status)) return conflict(reason);
  if ((t.byAuthorOnly && ctx.actorId !== ctx.authorId) || (t.notAuthor && ctx.actorId === ctx.authorId)) return forbidden(reason);
  return validationError({ comment: reason }, reason);
}

/**
 * Moves the sheet's latest revision through review: submit (draft/returned → in
 * review; inputs must be valid, results are recomputed), withdraw (author: in review →
 * draft), approve (another lead: in review → approved; the previously approved revision
 * becomes superseded), return (another lead, with a comment: in review → returned).
 * `transitionAllowed` decides; every transition bumps the sheet version, writes its
 * audit events and queues its e-mails (review requested → the organisation's other
 * active leads; approved/returned → the author) in one transaction.
 * Errors: 403 role, author-only or four-eyes; 400 invalid request, missing comment for
 * return, or invalid inputs on submit (field errors); 404 sheet not in the
 * organisation; 409 stale version or a state the transition cannot start from.
 */
export async function transitionSheet(actor: Actor, raw: unknown): Promise<TransitionResult> {
  const input = parseInput(transitionSheetSchema, raw);
  requirePermission(actor, TRANSITION_PERMISSION[input.transition]);
  return db().transaction(async (tx) => {
    const { sheet, version } = await lockVersion(tx, actor, input.sheetId, input.version);
    const latest = await latestOf(tx, actor, sheet.id);
    const ctx = { status: latest.status, role: actor.role, actorId: actor.id, authorId: latest.authorId };
    const check = transitionAllowed(input.transition, { ...ctx, comment: input.comment });
    if (!check.ok) throw refusal(input.transition, ctx, check.reason);

    const project = await projectOf(tx, actor, sheet.projectId);
    const now = new Date();
    const org = actor.organisationId;
    const mail: SheetMailContext = {
      organisationId: org,
      project: { id: project.id, name: project.name },
      sheet: { id: sheet.id, tag: sheet.tag, title: sheet.title },
      revisionLabel: latest.label,
      authorId: latest.authorId,
    };
    const details: Record<string, unknown> = {
      transition: input.transition,
      revisionId: latest.id,
      ordinal: latest.ordinal,
      label: latest.label,
      from: latest.status,
      to: check.to,
      ...(input.comment ? { comment: input.comment } : {}),
    };
    const superseded: Awaited<ReturnType<typeof lockOtherApprovedRevisions>> = [];
    let notified: string[] = [];

    switch (input.transition) {
      case "submit": {
        const c = compute(sheet.kind, latest.inputs);
        if (c.inputErrors) throw validationError(c.inputErrors, "Fix the inputs marked before submitting this sheet for review");
        await updateRevision(tx, org, latest.id, {
          status: check.to,
          results: c.results,
          engineVersion: c.engineVersion,
          contentHash: c.contentHash,
          submittedAt: now,
          checkedById: null,
          decidedAt: null,
        });
        details.contentHash = c.contentHash;
        notified = await notifyReviewRequested(tx, { ...mail, submitterName: actor.name });
        break;
      }
      case "withdraw":
        await updateRevision(tx, org, latest.id, { status: check.to, submittedAt: null });
        break;
      case "approve": {
        await updateRevision(tx, org, latest.id, {
          status: check.to,
          checkedById: actor.id,
          decidedAt: now,
          ...(input.comment ? { reviewComment: input.comment } : {}),
        });
        for (const old of await lockOtherApprovedRevisions(tx, org, sheet.id, latest.id)) {
          await updateRevision(tx, org, old.id, { status: "superseded" });
          superseded.push(old);
        }
        details.contentHash = latest.contentHash;
        notified = await notifyApproved(tx, { ...mail, approverName: actor.name });
        break;
      }
      case "return":
        await updateRevision(tx, org, latest.id, { status: check.to, checkedById: actor.id, decidedAt: now, reviewComment: input.comment });
        notified = await notifyReturned(tx, { ...mail, reviewerName: actor.name, comment: input.comment ?? "" });
        break;
    }
    if (superseded.length) details.superseded = superseded.map((r) => r.label);
    await audit(tx, { organisationId: org, actorId: actor.id, event: TRANSITION_EVENT[input.transition], entityType: "sheet", entityId: sheet.id, details });
    for (const old of superseded) {
      await audit(tx, {
        organisationId: org,
        actorId: actor.id,
        event: "sheet.superseded",
        entityType: "sheet",
        entityId: sheet.id,
        details: { revisionId: old.id, ordinal: old.ordinal, label: old.label, from: "approved", to: "superseded", supersededBy: { revisionId: latest.id, label: latest.label } },
      });
    }
    return {
      sheetId: sheet.id,
      projectId: sheet.projectId,
      version,
      revision: ref(latest, check.to),
      superseded: superseded.map((r) => r.label),
      notified,
    };
  });
}
