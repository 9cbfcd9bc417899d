import "server-only";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { organisations } from "@/db/schema";

/** The organisation's display name for the signed-in shell. */
export async function getOrganisationName(organisationId: number): Promise<string> {
  const [row] = await db().select({ name: organisations.name }).from(organisations).where(eq(organisations.id, organisationId)).limit(1);
  return row?.name ?? "";
}
