import { notFound } from "@/lib/errors";

/** Route ids are positive integers; anything else is simply not found. */
export function parseRouteId(raw: string | undefined, what: string): number {
  const id = /^\d{1,10}$/.test(raw ?? "") ? Number(raw) : NaN;
  if (!Number.isSafeInteger(id) || id < 1 || id > 2 ** 32 - 1) throw notFound(`${what} not found`);
  return id;
}

/** Revision ordinals are 0, 1, 2 …; anything else is not found. */
export function parseOrdinal(raw: string | undefined): number {
  const n = /^\d{1,6}$/.test(raw ?? "") ? Number(raw) : NaN;
  if (!Number.isSafeInteger(n)) throw notFound("Revision not found");
  return n;
}
