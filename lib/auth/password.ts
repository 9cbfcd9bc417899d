import { hash, verify } from "@node-rs/argon2";

// argon2id with the library defaults (m = 19 MiB, t = 2, p = 1): OWASP Password Storage
// Cheat Sheet's first recommended configuration.
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

// A real hash of a random string, verified against when the e-mail is unknown so that
// unknown and known e-mails take the same time.
let dummy: Promise<string> | undefined;

export async function verifyPassword(stored: string | undefined, password: string): Promise<boolean> {
  if (!stored) {
    dummy ??= hash("ohmstead-timing-equaliser-" + Math.random());
    await verify(await dummy, password).catch(() => false);
    return false;
  }
  try {
    return await verify(stored, password);
  } catch {
    return false;
  }
}

export const PASSWORD_RULE = { min: 10, max: 200 } as const;
