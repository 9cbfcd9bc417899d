import { and, count, eq, gte, min } from "drizzle-orm";
import { db } from "@/db/client";
import { signInAttempts } from "@/db/schema";

/** 5 failed sign-ins per e-mail in 15 minutes lock that e-mail until the oldest expires. */
export const THROTTLE = { maxFailures: 5, windowMinutes: 15 } as const;

/** Returns the time the e-mail may try again, or null when it may try now. Held in the database so it holds across app instances. */
export async function lockedUntil(email: string, now = new Date()): Promise<Date | null> {
  const since = new Date(now.getTime() - THROTTLE.windowMinutes * 60_000);
  const [row] = await db()
    .select({ failures: count(), oldest: min(signInAttempts.createdAt) })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.email, email), eq(signInAttempts.succeeded, "failure"), gte(signInAttempts.createdAt, since)));
  if (!row || row.failures < THROTTLE.maxFailures || !row.oldest) return null;
  return new Date(new Date(row.oldest).getTime() + THROTTLE.windowMinutes * 60_000);
}

export async function recordAttempt(email: string, ok: boolean, ip?: string | null) {
  await db().insert(signInAttempts).values({ email, succeeded: ok ? "success" : "failure", ip: ip?.slice(0, 64) ?? null });
}

export function formatRetry(until: Date, now = new Date()): string {
  const minutes = Math.max(1, Math.ceil((until.getTime() - now.getTime()) / 60_000));
  return `Too many failed sign-ins for this e-mail. Try again in ${minutes} minute${minutes === 1 ? "" : "s"} (at ${until.toISOString().slice(11, 16)} UTC).`;
}
