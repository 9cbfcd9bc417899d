import type { ProjectListQuery } from "@/lib/validation/project";

const BASE = "/api/v1/projects";

/** The SWR key (and URL) of one project-list view. */
export function projectListKey(q: ProjectListQuery): string {
  const p = new URLSearchParams({ q: q.q, sort: q.sort, dir: q.dir, archived: q.archived ? "1" : "0" });
  return `${BASE}?${p.toString()}`;
}

/** Matches every cached project-list view, so a create or edit refreshes them all. */
export function isProjectListKey(key: unknown): boolean {
  return typeof key === "string" && key.startsWith(`${BASE}?`);
}
