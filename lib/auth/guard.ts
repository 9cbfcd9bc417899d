import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { notFound as nextNotFound } from "next/navigation";
import { eq } from "drizzle-orm";
import type { z } from "zod";
import { db } from "@/db/client";
import { users, type Role } from "@/db/schema";
import { AppError, errorBody, forbidden, toAppError, unauthenticated, validationError } from "@/lib/errors";
import { fieldErrors } from "@/lib/engine/core/schema";
import { authOptions } from "./options";
import { can, type Permission } from "./roles";

/**
 * The one guard. Every page, server action and route handler gets its user here:
 * signed in, still active (checked in the database at every request, so a
 * deactivated user is refused at once), with the role and organisation stored now.
 * API tokens are the one exception: the route guard resolves them through a cache of a
 * few seconds, emptied by revocations and role/status changes (see lib/auth/tokens.ts).
 */
export interface Actor {
  id: number;
  organisationId: number;
  role: Role;
  name: string;
  email: string;
}

/** Resolves request credentials other than the session cookie (API tokens); set by the token module. */
type AlternativeResolver = (authorization: string) => Promise<Actor | null>;
let bearerResolver: AlternativeResolver | undefined;
export function registerBearerResolver(fn: AlternativeResolver) {
  bearerResolver = fn;
}

async function loadActiveUser(userId: number): Promise<Actor | null> {
  const [u] = await db()
    .select({ id: users.id, organisationId: users.organisationId, role: users.role, name: users.name, email: users.email, status: users.status })
    .from(users)
    .where(eq(users.id, userId))
    .limit(1);
  if (!u || u.status !== "active") return null;
  return { id: u.id, organisationId: u.organisationId, role: u.role, name: u.name, email: u.email };
}

export async function currentActor(): Promise<Actor | null> {
  const session = await getServerSession(authOptions);
  const id = session?.user?.id;
  if (!id) return null;
  return loadActiveUser(id);
}

/** For server actions and handlers: throws 401/403 from the vocabulary. */
export async function requireActor(permission?: Permission): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) throw unauthenticated();
  if (permission && !can(actor.role, permission)) throw forbidden();
  return actor;
}

/** For pages: redirects to sign-in, or shows the not-found page for a missing permission. */
export async function requirePageActor(permission?: Permission): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect("/login");
  if (permission && !can(actor.role, permission)) nextNotFound();
  return actor;
}

export type ActionResult<T> =
  | { ok: true; data: T }
  | { ok: false; error: { code: AppError["code"]; message: string; fields?: Record<string, string> } };

/**
 * Wraps a server action: validates the input with its zod schema, checks the user and
 * the permission, then runs the body. Errors come back as values, never as stack traces.
 */
export function guardedAction<S extends z.ZodType, T>(
  opts: { permission: Permission; schema: S },
  body: (input: z.output<S>, actor: Actor) => Promise<T>,
): (raw: unknown) => Promise<ActionResult<T>> {
  return async (raw: unknown) => {
    try {
      const actor = await requireActor(opts.permission);
      const parsed = opts.schema.safeParse(raw);
      if (!parsed.success) throw validationError(fieldErrors(parsed.error));
      return { ok: true, data: await body(parsed.data, actor) };
    } catch (err) {
      const e = toAppError(err);
      return { ok: false, error: errorBody(e).error };
    }
  };
}

export interface RouteContext<P> {
  req: Request;
  actor: Actor;
  params: P;
}

/**
 * Wraps a route handler of the JSON API: authenticates by session cookie or bearer
 * token, checks the permission, maps errors to the vocabulary.
 */
export function guardedRoute<P extends Record<string, string> = Record<string, string>>(
  opts: { permission?: Permission },
  body: (ctx: RouteContext<P>) => Promise<Response | unknown>,
) {
  return async (req: Request, ctx: { params: Promise<P> }): Promise<Response> => {
    try {
      let actor: Actor | null = null;
      const authz = req.headers.get("authorization");
      if (authz && /^bearer /i.test(authz)) {
        // Loaded on demand: tokens.ts imports this module, so a static import would be circular.
        const resolve = bearerResolver ?? (await import("./tokens")).resolveBearerCached;
        actor = await resolve(authz.slice(7).trim());
        if (!actor) throw unauthenticated("The API token is not valid or was revoked");
      } else {
        actor = await currentActor();
      }
      if (!actor) throw unauthenticated();
      if (opts.permission && !can(actor.role, opts.permission)) throw forbidden();
      const out = await body({ req, actor, params: ctx?.params ? await ctx.params : ({} as P) });
      return out instanceof Response ? out : Response.json(out);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export function errorResponse(err: unknown): Response {
  const e = toAppError(err);
  return Response.json(errorBody(e), { status: e.status });
}

/** Parses a JSON request body with a schema; 400 with field errors otherwise. */
export async function readJson<S extends z.ZodType>(req: Request, schema: S): Promise<z.output<S>> {
  let raw: unknown;
  try {
    raw = await req.json();
  } catch {
    throw validationError({ _: "The request body must be JSON" }, "The request body must be JSON");
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw validationError(fieldErrors(parsed.error));
  return parsed.data;
}
