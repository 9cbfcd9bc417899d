// Demo data: an invented panel-building company with one user per role, three projects,
// calculation sheets on the first project in each review state (approved, in review, draft),
// that project's cable schedule and the organisation's (illustrative) ampacity table.
// Usage: npm run db:seed   (idempotent: does nothing when the demo organisation exists)
import { pathToFileURL } from "node:url";
import { eq } from "drizzle-orm";
import type { Db } from "../db/client";
import type { Tx } from "../db/client";
import { organisations, projects, sheetRevisions, sheets, users, type Role, type SheetStatus } from "../db/schema";
import { audit } from "../lib/audit";
import { runCalc, ENGINE_VERSION } from "../lib/engine";
import { contentHash } from "../lib/hash";
import { defaultInputs, type ProjectBasis } from "../lib/sheets/kinds";
import { hashPassword } from "../lib/auth/password";
import { seedDemoAmpacityTable } from "./demo/seed-ampacity";
import { seedDemoSchedule } from "./demo/seed-schedule";
import { loadEnvFile } from "./load-env";

export const DEMO_ORGANISATION = { name: "Wrenfield Panelcraft", slug: "wrenfield-panelcraft" } as const;

/** Demo sign-ins: fixed passwords so a fresh install can be tried at once. Change them for anything but a demo. */
export const DEMO_USERS: readonly { email: string; name: string; role: Role; password: string }[] = [
  { email: "admin@wrenfield.example", name: "Maren Holt", role: "admin", password: "ohmstead-admin-demo" },
  { email: "lead@wrenfield.example", name: "Idris Pennock", role: "lead", password: "ohmstead-lead-demo" },
  { email: "engineer@wrenfield.example", name: "Tova Lindqvist", role: "engineer", password: "ohmstead-engineer-demo" },
  { email: "viewer@wrenfield.example", name: "Cal Rennard", role: "viewer", password: "ohmstead-viewer-demo" },
];

const FT = 0.3048;

/** Stored in SI (°C, m) whatever the project's display units. */
export const DEMO_PROJECTS = [
  {
    code: "WPC-24017",
    name: "Main LV switchboard MSB-1, cold store extension",
    client: "Halvergate Cold Logistics",
    site: "Unit 4, Marsh Lane Distribution Park",
    systemVoltage: 400,
    systemType: "3ph-4w",
    frequency: 50,
    earthing: "TN-S",
    designAmbient: 35,
    altitude: 40,
    standardFamily: "iec",
    unitSystem: "metric",
    notes: "Form 4b separation. Incomer 2500 A ACB from the 1600 kVA transformer; outgoing ways for refrigeration plant and the new loading bays.",
  },
  {
    code: "WPC-24022",
    name: "Motor control centre MCC-2, pumping station",
    client: "Brackenmoor Water Services",
    site: "Tollgate Lift Pumping Station",
    systemVoltage: 415,
    systemType: "3ph-4w",
    frequency: 50,
    earthing: "TN-C-S",
    designAmbient: 40,
    altitude: 120,
    standardFamily: "iec",
    unitSystem: "metric",
    notes: "Four duty/standby pump starters (two VSD, two soft start). Switchroom is not air-conditioned: check enclosure heat at 40 °C ambient.",
  },
  {
    code: "WPC-24031",
    name: "Process control panel CP-7, bottling line",
    client: "Copperbeck Beverages",
    site: "Line 3 packaging hall, Fairhollow plant",
    systemVoltage: 480,
    systemType: "3ph-3w",
    frequency: 60,
    earthing: "TN-S",
    designAmbient: 40,
    altitude: 850 * FT,
    standardFamily: "north-american",
    unitSystem: "imperial",
    notes: "Export build to North American requirements; 24 V DC control from an internal supply. Customer specifies 104 °F design ambient.",
  },
] as const;

export interface SeedResult {
  created: boolean;
  organisationId: number;
  users: typeof DEMO_USERS;
}

/** Creates the demo organisation on a database without it; returns created: false when it already exists. */
export async function seedDemo(database: Db): Promise<SeedResult> {
  const [existing] = await database
    .select({ id: organisations.id })
    .from(organisations)
    .where(eq(organisations.slug, DEMO_ORGANISATION.slug))
    .limit(1);
  if (existing) return { created: false, organisationId: existing.id, users: DEMO_USERS };

  const hashes = await Promise.all(DEMO_USERS.map((u) => hashPassword(u.password)));
  const organisationId = await database.transaction(async (tx) => {
    const [org] = await tx.insert(organisations).values({ name: DEMO_ORGANISATION.name, slug: DEMO_ORGANISATION.slug }).$returningId();
    const orgId = org!.id;
    const userIds = new Map<Role, number>();
    for (const [i, u] of DEMO_USERS.entries()) {
      const [row] = await tx
        .insert(users)
        .values({ organisationId: orgId, email: u.email, name: u.name, role: u.role, passwordHash: hashes[i]! })
        .$returningId();
      userIds.set(u.role, row!.id);
    }
    const leadId = userIds.get("lead")!;
    await seedDemoAmpacityTable(tx, orgId, userIds.get("admin")!);
    for (const [index, p] of DEMO_PROJECTS.entries()) {
      const [row] = await tx
        .insert(projects)
        .values({ ...p, organisationId: orgId, createdById: leadId })
        .$returningId();
      if (index === 0) {
        const basis: ProjectBasis = {
          unitSystem: p.unitSystem,
          systemVoltage: p.systemVoltage,
          systemType: p.systemType,
          frequency: p.frequency,
          designAmbientC: p.designAmbient,
          altitudeM: p.altitude,
          standardFamily: p.standardFamily,
        };
        await seedDemoSheets(tx, orgId, row!.id, basis, { engineer: userIds.get("engineer")!, lead: leadId });
        await seedDemoSchedule(tx, { organisationId: orgId, projectId: row!.id, userId: userIds.get("engineer")! }, p);
      }
      await audit(tx, {
        organisationId: orgId,
        actorId: leadId,
        event: "project.created",
        entityType: "project",
        entityId: row!.id,
        details: { code: p.code, name: p.name, seeded: true },
      });
    }
    return orgId;
  });
  return { created: true, organisationId, users: DEMO_USERS };
}

/** The demo sheets of the first project: inputs start from the project's defaults with a few design values of our own scenario. */
export const DEMO_SHEETS: readonly { kind: string; tag: string; title: string; status: SheetStatus; tweak: Record<string, unknown> }[] = [
  { kind: "busbar-rating", tag: "BR-01", title: "Main horizontal busbar, 2500 A incomer section", status: "approved", tweak: { current_A: 2500 } },
  { kind: "fault-withstand", tag: "FW-01", title: "Main busbar short-circuit withstand, 50 kA 1 s", status: "approved", tweak: {} },
  { kind: "voltage-drop", tag: "VD-01", title: "Feeder to loading-bay distribution board DB-L1", status: "in_review", tweak: {} },
  { kind: "enclosure-heat", tag: "EH-01", title: "Incomer section heat budget", status: "draft", tweak: {} },
  { kind: "bus-network", tag: "BN-01", title: "Main distribution board MDB-1, incomer to tap-offs", status: "draft", tweak: {} },
];

async function seedDemoSheets(tx: Tx, orgId: number, projectId: number, basis: ProjectBasis, who: { engineer: number; lead: number }) {
  for (const [position, d] of DEMO_SHEETS.entries()) {
    const inputs = { ...defaultInputs(d.kind, basis), ...d.tweak };
    const run = runCalc(d.kind, inputs);
    if (!run.ok) throw new Error(`seed: demo sheet ${d.tag} has invalid inputs: ${JSON.stringify(run.fields)}`);
    const results = run.result as unknown as Record<string, unknown>;
    const [sheet] = await tx
      .insert(sheets)
      .values({ organisationId: orgId, projectId, kind: d.kind, tag: d.tag, title: d.title, position, createdById: who.engineer })
      .$returningId();
    const decided = d.status === "approved" ? new Date() : null;
    await tx.insert(sheetRevisions).values({
      organisationId: orgId,
      sheetId: sheet!.id,
      ordinal: 0,
      label: "A",
      status: d.status,
      inputs,
      results,
      engineVersion: ENGINE_VERSION,
      contentHash: contentHash(inputs, results, ENGINE_VERSION),
      authorId: who.engineer,
      checkedById: d.status === "approved" ? who.lead : null,
      submittedAt: d.status === "draft" ? null : new Date(),
      decidedAt: decided,
    });
    await audit(tx, { organisationId: orgId, actorId: who.engineer, event: "sheet.created", entityType: "sheet", entityId: sheet!.id, details: { tag: d.tag, label: "A", seeded: true } });
    if (d.status !== "draft")
      await audit(tx, { organisationId: orgId, actorId: who.engineer, event: "sheet.submitted", entityType: "sheet", entityId: sheet!.id, details: { transition: "submit", label: "A", seeded: true } });
    if (d.status === "approved")
      await audit(tx, { organisationId: orgId, actorId: who.lead, event: "sheet.approved", entityType: "sheet", entityId: sheet!.id, details: { transition: "approve", label: "A", seeded: true } });
  }
}

function printSignIns(result: SeedResult) {
  const rows = result.users.map((u) => [u.role, u.name, u.email, u.password]);
  const head = ["Role", "Name", "E-mail", "Password"];
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i]!)).join("  ").trimEnd();
  console.log(line(head));
  console.log(widths.map((w) => "-".repeat(w)).join("  "));
  for (const r of rows) console.log(line(r));
}

async function main() {
  loadEnvFile();
  const { db, closeDb } = await import("../db/client");
  try {
    const result = await seedDemo(db());
    console.log(
      result.created
        ? `seed: created ${DEMO_ORGANISATION.name} with ${DEMO_USERS.length} users and ${DEMO_PROJECTS.length} projects (${DEMO_SHEETS.length} calculation sheets on ${DEMO_PROJECTS[0].code}).`
        : `seed: ${DEMO_ORGANISATION.name} already exists; nothing changed.`,
    );
    console.log(`\nDemo sign-ins${result.created ? "" : " (as first seeded; unchanged unless someone changed them)"} — demo only, change or remove these users before real use:\n`);
    printSignIns(result);
  } catch (err) {
    console.error("seed: failed:", err instanceof Error ? err.message : err);
    process.exitCode = 1;
  } finally {
    await closeDb();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await main();
