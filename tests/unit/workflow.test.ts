import { describe, expect, it } from "vitest";
import { SHEET_STATUSES, ROLES } from "@/db/schema";
import { TRANSITIONS, TRANSITION_NAMES, transitionAllowed } from "@/lib/sheets/workflow";
import { revisionLabel } from "@/lib/sheets/revision-label";
import { canonicalJson, contentHash } from "@/lib/hash";

describe("sheet workflow transitions", () => {
  const author = 1;
  const other = 2;

  it("an engineer submits a draft; it goes to review", () => {
    expect(transitionAllowed("submit", { status: "draft", role: "engineer", actorId: author, authorId: author })).toEqual({ ok: true, to: "in_review" });
  });

  it("a lead cannot approve their own sheet (four eyes)", () => {
    const r = transitionAllowed("approve", { status: "in_review", role: "lead", actorId: author, authorId: author });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/own sheet/);
  });

  it("another lead approves; an engineer or viewer cannot", () => {
    expect(transitionAllowed("approve", { status: "in_review", role: "lead", actorId: other, authorId: author }).ok).toBe(true);
    expect(transitionAllowed("approve", { status: "in_review", role: "engineer", actorId: other, authorId: author }).ok).toBe(false);
    expect(transitionAllowed("approve", { status: "in_review", role: "viewer", actorId: other, authorId: author }).ok).toBe(false);
  });

  it("returning needs a comment", () => {
    expect(transitionAllowed("return", { status: "in_review", role: "lead", actorId: other, authorId: author, comment: "  " }).ok).toBe(false);
    expect(transitionAllowed("return", { status: "in_review", role: "lead", actorId: other, authorId: author, comment: "Check the gap" })).toEqual({ ok: true, to: "returned" });
  });

  it("only the author withdraws from review", () => {
    expect(transitionAllowed("withdraw", { status: "in_review", role: "engineer", actorId: other, authorId: author }).ok).toBe(false);
    expect(transitionAllowed("withdraw", { status: "in_review", role: "engineer", actorId: author, authorId: author }).ok).toBe(true);
  });

  it("nothing leaves approved or superseded by a transition, and admins and viewers never act", () => {
    for (const name of TRANSITION_NAMES) {
      for (const status of ["approved", "superseded"] as const) {
        for (const role of ROLES) expect(transitionAllowed(name, { status, role, actorId: other, authorId: author, comment: "x" }).ok).toBe(false);
      }
      for (const status of SHEET_STATUSES) {
        expect(transitionAllowed(name, { status, role: "viewer", actorId: other, authorId: author, comment: "x" }).ok).toBe(false);
        expect(transitionAllowed(name, { status, role: "admin", actorId: other, authorId: author, comment: "x" }).ok).toBe(false);
      }
    }
    expect(Object.keys(TRANSITIONS).sort()).toEqual(["approve", "return", "submit", "withdraw"]);
  });
});

describe("revision labels", () => {
  it("letters A…Z then AA; numbers from 0", () => {
    expect([0, 1, 25, 26, 27, 51, 52].map((n) => revisionLabel(n, "letter"))).toEqual(["A", "B", "Z", "AA", "AB", "AZ", "BA"]);
    expect([0, 1, 10].map((n) => revisionLabel(n, "number"))).toEqual(["0", "1", "10"]);
  });
});

describe("content hash", () => {
  it("does not depend on key order but does on values", () => {
    expect(canonicalJson({ b: 1, a: { d: 2, c: 3 } })).toBe('{"a":{"c":3,"d":2},"b":1}');
    expect(contentHash({ a: 1, b: 2 }, { x: 1 }, "1.0.0")).toBe(contentHash({ b: 2, a: 1 }, { x: 1 }, "1.0.0"));
    expect(contentHash({ a: 1, b: 2 }, { x: 1 }, "1.0.0")).not.toBe(contentHash({ a: 1, b: 3 }, { x: 1 }, "1.0.0"));
    expect(contentHash({ a: 1 }, { x: 1 }, "1.0.0")).toMatch(/^[0-9a-f]{64}$/);
  });
});
