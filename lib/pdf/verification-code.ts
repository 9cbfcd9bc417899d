import { createHash } from "node:crypto";

/**
 * The short code printed in an approval stamp: the first 10 characters (base32,
 * RFC 4648 alphabet) of SHA-256 over the revision's stored content hash, the sheet id
 * and the revision ordinal. Deterministic (the same revision always prints the same
 * code), nothing new is stored, and 50 bits are far beyond guessing by trying codes.
 */
const ALPHABET = "ABCDEFGHIJKLMNOPQRSTUVWXYZ234567";
export const CODE_LENGTH = 10;

export function base32(bytes: Uint8Array): string {
  let out = "";
  let bits = 0;
  let value = 0;
  for (const b of bytes) {
    value = (value << 8) | b;
    bits += 8;
    while (bits >= 5) {
      out += ALPHABET[(value >>> (bits - 5)) & 31];
      bits -= 5;
    }
    value &= (1 << bits) - 1;
  }
  if (bits > 0) out += ALPHABET[(value << (5 - bits)) & 31];
  return out;
}

export function verificationCode(contentHash: string, sheetId: number, ordinal: number): string {
  const digest = createHash("sha256").update(`${contentHash}:${sheetId}:${ordinal}`).digest();
  return base32(digest).slice(0, CODE_LENGTH);
}

/**
 * The first 12 hex digits (48 of the code's 50 bits) of the digest a normalised code was
 * cut from: what the database compares against its own SHA-2 of a revision, before the
 * full code is checked here.
 */
export function codeDigestPrefix(code: string): string {
  let bits = "";
  for (const ch of code) bits += ALPHABET.indexOf(ch).toString(2).padStart(5, "0");
  let hex = "";
  for (let i = 0; i + 4 <= 48; i += 4) hex += parseInt(bits.slice(i, i + 4), 2).toString(16);
  return hex;
}

/** A code as typed or scanned: case and spaces forgiven; null when it cannot be a code. */
export function normaliseCode(raw: string): string | null {
  const c = raw.replace(/[\s-]/g, "").toUpperCase();
  return new RegExp(`^[A-Z2-7]{${CODE_LENGTH}}$`).test(c) ? c : null;
}

/** The public address of a verification page. */
export function verificationUrl(appUrl: string, code: string): string {
  return `${appUrl.replace(/\/+$/, "")}/verify/${code}`;
}
