// Direct database fixtures for the browser tests (the e2e database only: services.ts has
// pointed DB_* and DATABASE_URL at the private instance before any test file loads).
import { and, count, eq } from "drizzle-orm";
import { db } from "../../../db/client";
import { organisations, projects, users, type Role } from "../../../db/schema";
import { hashPassword } from "../../../lib/auth/password";
import { DEMO_ORGANISATION, DEMO_PROJECTS, DEMO_USERS } from "../../../scripts/seed";

export { DEMO_PROJECTS, DEMO_USERS };

export function demoUser(role: Role) {
  const u = DEMO_USERS.find((x) => x.role === role);
  if (!u) throw new Error(`no demo user with role ${role}`);
  return u;
}

export async function demoOrganisationId(): Promise<number> {
  const [o] = await db().select({ id: organisations.id }).from(organisations).where(eq(organisations.slug, DEMO_ORGANISATION.slug));
  if (!o) throw new Error("the demo organisation is missing from the e2e database");
  return o.id;
}

export async function projectIdByCode(organisationId: number, code: string): Promise<number> {
  const [p] = await db()
    .select({ id: projects.id })
    .from(projects)
    .where(and(eq(projects.organisationId, organisationId), eq(projects.code, code)));
  if (!p) throw new Error(`project ${code} not found`);
  return p.id;
}

export async function projectRow(id: number) {
  const [p] = await db().select().from(projects).where(eq(projects.id, id));
  return p;
}

export async function countProjects(organisationId: number): Promise<number> {
  const [r] = await db().select({ n: count() }).from(projects).where(eq(projects.organisationId, organisationId));
  return r?.n ?? 0;
}

/** A user in the demo organisation (or another), created straight in the database. */
export async function createUser(organisationId: number, email: string, password: string, role: Role, name = "Test User") {
  const [row] = await db()
    .insert(users)
    .values({ organisationId, email, name, role, passwordHash: await hashPassword(password) })
    .$returningId();
  return row!.id;
}

/** A second organisation with one engineer and one project of its own. */
export async function createSecondOrganisation(unique: string) {
  const password = `second-org-${unique}-pw`;
  const email = `engineer-${unique}@second-org.example`;
  const [org] = await db()
    .insert(organisations)
    .values({ name: `Second Organisation ${unique}`, slug: `second-${unique}` })
    .$returningId();
  const organisationId = org!.id;
  const userId = await createUser(organisationId, email, password, "engineer", "Second Org Engineer");
  const [project] = await db()
    .insert(projects)
    .values({
      organisationId,
      code: `SO-${unique}`.slice(0, 40),
      name: "Second organisation distribution board",
      systemVoltage: 400,
      systemType: "3ph-4w",
      frequency: 50,
      earthing: "TN-S",
      designAmbient: 30,
      altitude: 0,
      standardFamily: "iec",
      unitSystem: "metric",
      createdById: userId,
    })
    .$returningId();
  return { organisationId, email, password, userId, projectId: project!.id };
}
