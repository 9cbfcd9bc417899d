import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { auditEvents, projects } from "@/db/schema";
import {
  createProject,
  getProject,
  listProjectAudit,
  listProjects,
  setProjectArchived,
  updateProject,
} from "@/db/queries/projects";
import type { Actor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { fieldErrors } from "@/lib/engine/core/schema";
import { AppError } from "@/lib/errors";
import { projectListQuerySchema, projectSchema, projectUpdateSchema, STALE_PROJECT_MESSAGE, type ProjectInput } from "@/lib/validation/project";
import { makeOrg, makeUser, resetDb, type TestUser } from "../support/db";

const actorOf = (u: TestUser): Actor => ({ id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });

const formValues = {
  code: "WPC-100",
  name: "Distribution board DB-3",
  client: "Example Client",
  site: "North yard",
  systemVoltage: "400",
  systemType: "3ph-4w",
  frequency: "50",
  earthing: "TN-S",
  designAmbient: "35",
  altitude: "120",
  standardFamily: "iec",
  unitSystem: "metric",
  notes: "",
};

function valid(overrides: Partial<typeof formValues> = {}): ProjectInput {
  return projectSchema.parse({ ...formValues, ...overrides });
}

function errorsOf(raw: unknown) {
  const r = projectSchema.safeParse(raw);
  expect(r.success).toBe(false);
  return r.success ? {} : fieldErrors(r.error);
}

async function caught(p: Promise<unknown>): Promise<AppError> {
  try {
    await p;
  } catch (err) {
    expect(err).toBeInstanceOf(AppError);
    return err as AppError;
  }
  throw new Error("expected the call to fail");
}

describe("project schema", () => {
  it("names the field and the AC range for a voltage below 12 V", () => {
    expect(errorsOf({ ...formValues, systemVoltage: "5" }).systemVoltage).toMatch(/^System voltage must be from 12 to 1000 V/);
  });

  it("allows up to 1500 V for DC and names that range above it", () => {
    expect(projectSchema.safeParse({ ...formValues, systemType: "dc", frequency: "0", systemVoltage: "1500" }).success).toBe(true);
    expect(errorsOf({ ...formValues, systemType: "dc", frequency: "0", systemVoltage: "1600" }).systemVoltage).toMatch(/from 12 to 1500 V DC/);
    expect(errorsOf({ ...formValues, systemVoltage: "1100" }).systemVoltage).toMatch(/from 12 to 1000 V AC/);
  });

  it("requires a frequency consistent with the system type", () => {
    expect(errorsOf({ ...formValues, systemType: "dc", systemVoltage: "110" }).frequency).toBe("Frequency must be DC (0 Hz) for a DC system");
    expect(errorsOf({ ...formValues, frequency: "0" }).frequency).toBe("Frequency must be 50 or 60 Hz for an AC system");
    expect(errorsOf({ ...formValues, frequency: "55" }).frequency).toMatch(/^Frequency must be one of/);
  });

  it("checks ambient and altitude in the unit system's units", () => {
    expect(errorsOf({ ...formValues, designAmbient: "71" }).designAmbient).toBe("Design ambient temperature must be from -40 to 70 °C");
    expect(projectSchema.safeParse({ ...formValues, unitSystem: "imperial", designAmbient: "104", altitude: "9000" }).success).toBe(true);
    expect(errorsOf({ ...formValues, unitSystem: "imperial", designAmbient: "159" }).designAmbient).toBe("Design ambient temperature must be from -40 to 158 °F");
    expect(errorsOf({ ...formValues, altitude: "5001" }).altitude).toBe("Altitude must be from 0 to 5000 m");
    expect(errorsOf({ ...formValues, altitude: "abc" }).altitude).toBe("Altitude must be a number");
  });

  it("reports every bad field at once, and names required ones", () => {
    const e = errorsOf({ ...formValues, code: "", name: "", systemVoltage: "", notes: "x".repeat(4001) });
    expect(e.code).toBe("Project code is required");
    expect(e.name).toBe("Project name is required");
    expect(e.systemVoltage).toBe("System voltage is required");
    expect(e.notes).toBe("Notes must be at most 4000 characters");
    expect(errorsOf({ ...formValues, code: "A" }).code).toMatch(/2 to 40 characters/);
    expect(errorsOf({ ...formValues, code: "WPC 1" }).code).toMatch(/letters, digits/);
  });

  it("requires the version for an update and parses list queries", () => {
    expect(fieldErrors(projectUpdateSchema.safeParse({ ...formValues, id: 1 }).error!).version).toMatch(/Version is required/);
    expect(projectListQuerySchema.parse({})).toEqual({ q: "", sort: "updated", dir: "desc", archived: false });
    expect(projectListQuerySchema.safeParse({ sort: "voltage" }).success).toBe(false);
  });
});

describe("project data access", () => {
  let engineer: Actor;
  let lead: Actor;
  let viewer: Actor;
  let outsider: Actor;

  beforeAll(async () => {
    await resetDb();
  });
  afterAll(async () => {
    await closeDb();
  });
  beforeEach(async () => {
    await resetDb();
    const org = await makeOrg("Fenwick Switchgear");
    const other = await makeOrg("Other Panels");
    engineer = actorOf(await makeUser(org.id, "engineer"));
    lead = actorOf(await makeUser(org.id, "lead"));
    viewer = actorOf(await makeUser(org.id, "viewer"));
    outsider = actorOf(await makeUser(other.id, "admin"));
  });

  it("creates a project with its audit event, storing SI values", async () => {
    const { id } = await createProject(engineer, valid({ unitSystem: "imperial", designAmbient: "104", altitude: "1000" }));
    const p = await getProject(engineer.organisationId, id);
    expect(p).toMatchObject({ code: "WPC-100", version: 1, archivedAt: null, unitSystem: "imperial", createdByName: engineer.name });
    expect(p.designAmbientC).toBeCloseTo(40, 10); // (104 − 32) × 5/9
    expect(p.altitudeM).toBeCloseTo(304.8, 10); // 1000 ft × 0.3048 m/ft
    const events = await listProjectAudit(engineer.organisationId, id);
    expect(events.map((e) => e.event)).toEqual(["project.created"]);
    expect(events[0]!.actorName).toBe(engineer.name);
  });

  it("turns a duplicate code in the organisation into a field error, also in another letter case", async () => {
    await createProject(engineer, valid());
    const e = await caught(createProject(lead, valid({ code: "wpc-100", name: "Another" })));
    expect(e.status).toBe(400);
    expect(e.fields?.code).toMatch(/already used/);
    // The same code in another organisation is fine.
    await expect(createProject(outsider, valid())).resolves.toHaveProperty("id");
  });

  it("updates with the current version and refuses a stale one without overwriting", async () => {
    const { id } = await createProject(engineer, valid());
    const saved = await updateProject(lead, projectUpdateSchema.parse({ ...formValues, name: "Renamed board", id, version: 1 }));
    expect(saved.version).toBe(2);
    const e = await caught(updateProject(engineer, projectUpdateSchema.parse({ ...formValues, name: "Stale edit", id, version: 1 })));
    expect(e.status).toBe(409);
    expect(e.message).toBe(STALE_PROJECT_MESSAGE);
    const p = await getProject(engineer.organisationId, id);
    expect(p.name).toBe("Renamed board");
    expect(p.version).toBe(2);
    const events = await listProjectAudit(engineer.organisationId, id);
    expect(events.map((x) => x.event)).toEqual(["project.updated", "project.created"]);
    expect(events[0]!.details).toMatchObject({ changed: ["name"] });
    // Saving the same values again is not a new version.
    const again = await updateProject(lead, projectUpdateSchema.parse({ ...formValues, name: "Renamed board", id, version: 2 }));
    expect(again.version).toBe(2);
    expect(await listProjectAudit(engineer.organisationId, id)).toHaveLength(2);
  });

  it("rejects renaming to a code another project has", async () => {
    await createProject(engineer, valid());
    const { id } = await createProject(engineer, valid({ code: "WPC-101" }));
    const e = await caught(updateProject(engineer, projectUpdateSchema.parse({ ...formValues, id, version: 1 })));
    expect(e.fields?.code).toMatch(/WPC-100 is already used/);
    expect((await getProject(engineer.organisationId, id)).code).toBe("WPC-101");
  });

  it("treats another organisation's project as not found", async () => {
    const { id } = await createProject(engineer, valid());
    expect((await caught(getProject(outsider.organisationId, id))).status).toBe(404);
    expect((await caught(updateProject(outsider, projectUpdateSchema.parse({ ...formValues, id, version: 1 })))).status).toBe(404);
    expect((await caught(setProjectArchived(outsider, id, true))).status).toBe(404);
    expect(await listProjects(outsider.organisationId, projectListQuerySchema.parse({ archived: "1" }))).toEqual([]);
    const [row] = await db().select().from(projects).where(eq(projects.id, id));
    expect(row?.archivedAt).toBeNull();
  });

  it("lets only writers write and only leads and admins archive", async () => {
    expect(can("viewer", "project.write")).toBe(false);
    expect(can("engineer", "project.archive")).toBe(false);
    expect((await caught(createProject(viewer, valid()))).status).toBe(403);
    const { id } = await createProject(engineer, valid());
    expect((await caught(updateProject(viewer, projectUpdateSchema.parse({ ...formValues, id, version: 1 })))).status).toBe(403);
    expect((await caught(setProjectArchived(engineer, id, true))).status).toBe(403);
    expect(await db().select().from(projects)).toHaveLength(1);
  });

  it("archives and restores with audit events, and hides archived projects from the default list", async () => {
    const { id } = await createProject(engineer, valid());
    const archived = await setProjectArchived(lead, id, true);
    expect(archived.version).toBe(2);
    expect(await listProjects(lead.organisationId, projectListQuerySchema.parse({}))).toEqual([]);
    const all = await listProjects(lead.organisationId, projectListQuerySchema.parse({ archived: "1" }));
    expect(all.map((p) => p.code)).toEqual(["WPC-100"]);
    expect(all[0]!.archivedAt).not.toBeNull();
    // Editing an archived project is refused; archiving twice changes nothing.
    expect((await caught(updateProject(engineer, projectUpdateSchema.parse({ ...formValues, id, version: 2 })))).status).toBe(409);
    expect((await setProjectArchived(lead, id, true)).version).toBe(2);
    await setProjectArchived(lead, id, false);
    const events = await db()
      .select({ event: auditEvents.event })
      .from(auditEvents)
      .where(and(eq(auditEvents.entityType, "project"), eq(auditEvents.entityId, id)))
      .orderBy(auditEvents.id);
    expect(events.map((e) => e.event)).toEqual(["project.created", "project.archived", "project.restored"]);
    expect((await getProject(lead.organisationId, id)).archivedAt).toBeNull();
  });

  it("searches code, name, client and site, treats wildcards literally, and sorts", async () => {
    await createProject(engineer, valid({ code: "MCC_2", name: "Pump starters", client: "Brackenmoor", site: "Tollgate" }));
    await createProject(engineer, valid({ code: "MSB-1", name: "Main board", client: "Halvergate", site: "Marsh Lane" }));
    await createProject(engineer, valid({ code: "CP-7", name: "Control panel", client: "Copperbeck", site: "Fairhollow" }));
    const q = (raw: Record<string, string>) => listProjects(engineer.organisationId, projectListQuerySchema.parse(raw)).then((r) => r.map((p) => p.code));
    expect(await q({ q: "halver" })).toEqual(["MSB-1"]);
    expect(await q({ q: "tollgate" })).toEqual(["MCC_2"]);
    expect(await q({ q: "control" })).toEqual(["CP-7"]);
    expect(await q({ q: "C_" })).toEqual(["MCC_2"]);
    expect(await q({ q: "%" })).toEqual([]);
    expect(await q({ sort: "code", dir: "asc" })).toEqual(["CP-7", "MCC_2", "MSB-1"]);
    expect(await q({ sort: "client", dir: "desc" })).toEqual(["MSB-1", "CP-7", "MCC_2"]);
  });
});
