import type { Actor } from "@/lib/auth/guard";
import { createToken } from "@/lib/auth/tokens";
import type { TestUser } from "./db";

/**
 * Calls App Router route handlers directly, as Next would: a Request and a params
 * promise. Importing this module also installs the bearer-token resolver, so
 * `Authorization: Bearer ohm_…` works exactly as in the running app.
 */

export type Handler<P> = (req: Request, ctx: { params: Promise<P> }) => Promise<Response>;

export interface CallOptions<P> {
  token?: string;
  method?: string;
  path?: string;
  /** An object is sent as JSON; a string is sent as the raw body. */
  body?: unknown;
  params?: P;
}

export interface ApiReply {
  status: number;
  headers: Headers;
  // Tests read arbitrary JSON shapes; assertions check them.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  json: any;
}

export async function call<P extends Record<string, string>>(handler: Handler<P>, opts: CallOptions<P> = {}): Promise<ApiReply> {
  const headers: Record<string, string> = { "content-type": "application/json" };
  if (opts.token !== undefined) headers.authorization = `Bearer ${opts.token}`;
  const body = opts.body === undefined ? undefined : typeof opts.body === "string" ? opts.body : JSON.stringify(opts.body);
  const req = new Request(`http://127.0.0.1${opts.path ?? "/api/v1"}`, { method: opts.method ?? (body === undefined ? "GET" : "POST"), headers, body });
  const res = await handler(req, { params: Promise.resolve(opts.params ?? ({} as P)) });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = { unparsable: text };
  }
  return { status: res.status, headers: res.headers, json };
}

export const actorOf = (u: TestUser): Actor => ({ id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email });

/** A real API token of the user (created through the token module). */
export async function tokenFor(u: TestUser, name = "test token"): Promise<string> {
  return (await createToken(actorOf(u), name)).token;
}
