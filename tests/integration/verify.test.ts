import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, db } from "@/db/client";
import { projects } from "@/db/schema";
import { CALC_EXAMPLES } from "@/app/api/v1/calc/examples";
import { verificationView } from "@/app/verify/[code]/data";
import { lookupVerification } from "@/db/queries/verification";
import type { Actor } from "@/lib/auth/guard";
import { createHash } from "node:crypto";
import { base32, codeDigestPrefix, normaliseCode, verificationCode } from "@/lib/pdf/verification-code";
import { getSheet, saveSheet, transitionSheet } from "@/lib/sheets/service";
import { createSheet } from "@/lib/sheets/service";
import { actorOf } from "../support/api";
import { makeOrg, makeUser } from "../support/db";

// The public stamp check: the query and the page's data function against the test
// database, before and after a newer revision of the sheet is approved.
let eng: Actor;
let lead: Actor;
let sheetId = 0;
let version = 0;

async function approve(): Promise<void> {
  version = (await transitionSheet(eng, { sheetId, version, transition: "submit" })).version;
  version = (await transitionSheet(lead, { sheetId, version, transition: "approve" })).version;
}

beforeAll(async () => {
  const org = await makeOrg("Lantern Row Controls");
  eng = actorOf(await makeUser(org.id, "engineer"));
  lead = actorOf(await makeUser(org.id, "lead"));
  const [p] = await db()
    .insert(projects)
    .values({
      organisationId: org.id,
      code: "LRC-7",
      name: "Secret reservoir project",
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
  const c = await createSheet(eng, { projectId: p!.id, kind: "voltage-drop", tag: "VD-07", title: "Feeder to the chiller", inputs: CALC_EXAMPLES["voltage-drop"] });
  sheetId = c.sheetId;
  version = c.version;
});

afterAll(async () => {
  await closeDb();
});

describe("verification code", () => {
  it("is deterministic, base32 and differs between revisions", () => {
    const a = verificationCode("ab".repeat(32), 1, 0);
    expect(a).toBe(verificationCode("ab".repeat(32), 1, 0));
    expect(a).toMatch(/^[A-Z2-7]{10}$/);
    expect(verificationCode("ab".repeat(32), 1, 1)).not.toBe(a);
    expect(verificationCode("ab".repeat(32), 2, 0)).not.toBe(a);
    // RFC 4648 test vector: "foobar" → MZXW6YTBOI
    expect(base32(Buffer.from("foobar"))).toBe("MZXW6YTBOI");
    expect(normaliseCode(` ${a.toLowerCase().slice(0, 5)}-${a.slice(5)} `)).toBe(a);
    expect(normaliseCode("not a code")).toBeNull();
  });

  it("gives back the first 48 bits of the digest it was cut from, for the database to match", () => {
    for (const [hash, sheetId, ordinal] of [["ab".repeat(32), 1, 0], ["0f".repeat(32), 4711, 3], ["e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855", 90210, 12]] as const) {
      const digest = createHash("sha256").update(`${hash}:${sheetId}:${ordinal}`).digest("hex");
      expect(codeDigestPrefix(verificationCode(hash, sheetId, ordinal))).toBe(digest.slice(0, 12));
    }
  });
});

describe("verification lookup", () => {
  it("says unknown for a draft's code, approved and current once approved, superseded after a newer approval", async () => {
    const draft = (await getSheet(eng, sheetId)).current;
    const codeA = verificationCode(draft.contentHash, sheetId, draft.ordinal);
    expect((await lookupVerification(codeA)).state).toBe("unknown");

    await approve();
    const a = await lookupVerification(codeA.toLowerCase());
    expect(a).toMatchObject({ state: "approved-current", organisationName: "Lantern Row Controls", sheetTag: "VD-07", label: "A" });
    const viewA = await verificationView(codeA);
    expect(viewA.state).toBe("approved-current");
    expect(viewA.headline).toBe("Approved and current");
    expect(viewA.lines.join(" ")).toContain("VD-07");
    // Nothing else of the project: no project name, code, title or values.
    for (const hidden of ["Secret reservoir", "LRC-7", "chiller", "400"]) expect(viewA.lines.join(" ") + viewA.headline).not.toContain(hidden);

    // A new revision (B) with other inputs: while it is a draft, A stays in force.
    const saved = await saveSheet(eng, { sheetId, version, inputs: { ...CALC_EXAMPLES["voltage-drop"], length_m: 150 } });
    version = saved.version;
    expect(saved.newRevision).toBe(true);
    expect((await lookupVerification(codeA)).state).toBe("approved-current");

    await approve();
    const sheet = await getSheet(eng, sheetId);
    const b = sheet.current;
    expect(b.label).toBe("B");
    const superseded = await lookupVerification(codeA);
    expect(superseded.state).toBe("superseded");
    expect(superseded.supersededBy?.label).toBe("B");
    expect(superseded.supersededBy?.approvedAt?.getTime()).toBe(b.decidedAt!.getTime());
    const viewSup = await verificationView(codeA);
    expect(viewSup.headline).toBe("Superseded");
    expect(viewSup.lines.join(" ")).toContain(`Superseded by revision B, approved on ${b.decidedAt!.toISOString().slice(0, 10)}`);

    const codeB = verificationCode(b.contentHash, sheetId, b.ordinal);
    expect(codeB).not.toBe(codeA);
    expect((await lookupVerification(codeB)).state).toBe("approved-current");
  });

  it("says unknown for a code no revision carries and for text that is no code", async () => {
    expect((await lookupVerification("AAAAAAAAAA")).state).toBe("unknown");
    expect((await verificationView("<script>")).headline).toBe("Unknown code");
    expect((await lookupVerification("")).state).toBe("unknown");
  });
});
