import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { eq } from "drizzle-orm";
import { z } from "zod";
import { db } from "@/db/client";
import { users, type Role } from "@/db/schema";
import { env } from "@/lib/env";
import { audit } from "@/lib/audit";
import { verifyPassword } from "./password";
import { formatRetry, lockedUntil, recordAttempt } from "./throttle";

const credentials = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email()),
  password: z.string().min(1).max(200),
});

/**
 * Checks e-mail and password. Throws an Error whose message the sign-in page shows
 * (throttling says when to try again); returns null for wrong credentials.
 */
export async function authorizeCredentials(raw: unknown, ip?: string | null) {
  const parsed = credentials.safeParse(raw);
  if (!parsed.success) return null;
  const { email, password } = parsed.data;
  const until = await lockedUntil(email);
  if (until) throw new Error(formatRetry(until));
  const [user] = await db()
    .select({ id: users.id, organisationId: users.organisationId, role: users.role, name: users.name, email: users.email, passwordHash: users.passwordHash, status: users.status })
    .from(users)
    .where(eq(users.email, email))
    .limit(1);
  const ok = await verifyPassword(user?.passwordHash, password);
  if (!ok || !user || user.status !== "active") {
    await recordAttempt(email, false, ip);
    const after = await lockedUntil(email);
    if (after) throw new Error(formatRetry(after));
    return null;
  }
  await recordAttempt(email, true, ip);
  await db().transaction(async (tx) => {
    await tx.update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, user.id));
    await audit(tx, { organisationId: user.organisationId, actorId: user.id, event: "user.signed_in", entityType: "user", entityId: user.id, details: ip ? { ip } : {} });
  });
  return { id: String(user.id), name: user.name, email: user.email, organisationId: user.organisationId, role: user.role };
}

export const authOptions: NextAuthOptions = {
  secret: env().NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/login" },
  providers: [
    CredentialsProvider({
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      authorize: async (creds, req) => {
        const fwd = req?.headers?.["x-forwarded-for"];
        const ip = Array.isArray(fwd) ? fwd[0] : (fwd?.split(",")[0] ?? null);
        return authorizeCredentials(creds, ip);
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        const u = user as unknown as { id: string; organisationId: number; role: Role };
        token.userId = Number(u.id);
        token.organisationId = u.organisationId;
        token.role = u.role;
      }
      return token;
    },
    session({ session, token }) {
      session.user = { ...session.user, id: token.userId, organisationId: token.organisationId, role: token.role };
      return session;
    },
  },
};
