"use client";

import Link from "next/link";
import { useEffect, useState } from "react";
import useSWR from "swr";
import { DateTime } from "@/components/ui/date-time";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusBadge } from "@/components/ui/status-badge";
import type { ProjectListItem } from "@/db/queries/projects";
import type { SystemType } from "@/db/schema/projects";
// Types only: the validation module brings zod and the table definitions, which the list does not need in the browser.
import type { ProjectListQuery, ProjectSort } from "@/lib/validation/project";
import { projectListKey } from "./list-key";

interface ListResponse {
  projects: ProjectListItem[];
}

async function fetchList(url: string): Promise<ListResponse> {
  const res = await fetch(url, { headers: { accept: "application/json" }, cache: "no-store" });
  const body = (await res.json().catch(() => null)) as (ListResponse & { error?: { message: string } }) | null;
  if (!res.ok) throw new Error(body?.error?.message ?? `The project list could not be loaded (HTTP ${res.status})`);
  return body as ListResponse;
}

const COLUMNS: { sort: ProjectSort | null; label: string; className?: string }[] = [
  { sort: "code", label: "Code", className: "w-36" },
  { sort: "name", label: "Name" },
  { sort: "client", label: "Client" },
  { sort: null, label: "Site", className: "hidden lg:table-cell" },
  { sort: null, label: "Supply", className: "hidden md:table-cell" },
  { sort: "updated", label: "Updated", className: "w-44" },
];

function supply(p: ProjectListItem, systemTypeLabels: Record<SystemType, string>) {
  return `${p.systemVoltage} V · ${systemTypeLabels[p.systemType]}${p.frequency ? ` · ${p.frequency} Hz` : ""}`;
}

/** The value after it has stopped changing for `ms`, so typing does not fetch per keystroke. */
function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return settled;
}

/** The project list: search, sort and the archived toggle drive GET /api/v1/projects through SWR. */
export function ProjectsTable({
  initialQuery,
  initial,
  canWrite,
  systemTypeLabels,
}: {
  initialQuery: ProjectListQuery;
  initial: ProjectListItem[];
  canWrite: boolean;
  /** SYSTEM_TYPE_LABELS, handed over by the server page. */
  systemTypeLabels: Record<SystemType, string>;
}) {
  const [search, setSearch] = useState(initialQuery.q);
  const [sort, setSort] = useState<ProjectSort>(initialQuery.sort);
  const [dir, setDir] = useState<"asc" | "desc">(initialQuery.dir);
  const [archived, setArchived] = useState(initialQuery.archived);
  const q = useDebounced(search.trim(), 250);

  const key = projectListKey({ q, sort, dir, archived });
  const initialKey = projectListKey(initialQuery);
  const { data, error, isLoading, isValidating, mutate } = useSWR(key, fetchList, {
    fallbackData: key === initialKey ? { projects: initial } : undefined,
    keepPreviousData: true,
    revalidateOnMount: true,
  });
  const rows = data?.projects ?? [];

  function sortBy(column: ProjectSort) {
    if (column === sort) setDir(dir === "asc" ? "desc" : "asc");
    else {
      setSort(column);
      setDir(column === "updated" ? "desc" : "asc");
    }
  }

  return (
    <section aria-labelledby="projects-list-heading" className="panel">
      <h2 id="projects-list-heading" className="sr-only">
        Project list
      </h2>
      <div className="flex flex-col gap-3 border-b border-fen-100 p-4 sm:flex-row sm:items-end sm:justify-between">
        <div className="w-full sm:max-w-sm">
          <label htmlFor="project-search" className="field-label">
            Search projects
          </label>
          <input
            id="project-search"
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="Code, name, client or site"
            maxLength={100}
            className="field-input"
            aria-describedby="project-search-count"
          />
        </div>
        <div className="flex items-center gap-4">
          <label className="inline-flex cursor-pointer items-center gap-2 text-sm text-fen-700">
            <input type="checkbox" checked={archived} onChange={(e) => setArchived(e.target.checked)} className="h-4 w-4 rounded border-fen-300 accent-copper-600" />
            Show archived
          </label>
          <p id="project-search-count" className="text-xs text-fen-500" aria-live="polite">
            {isValidating && !isLoading ? "Updating…" : `${rows.length} project${rows.length === 1 ? "" : "s"}`}
          </p>
        </div>
      </div>

      {error ? (
        <div role="alert" className="flex items-center justify-between gap-4 p-4 text-sm text-signal-700">
          <span>{error instanceof Error ? error.message : "The project list could not be loaded"}</span>
          <button type="button" className="btn-secondary" onClick={() => void mutate()}>
            Try again
          </button>
        </div>
      ) : null}

      {!error && rows.length === 0 && !isLoading ? (
        q ? (
          <EmptyState title={`No project matches “${q}”`}>Search looks in the code, name, client and site{archived ? "" : " of active projects; tick Show archived to include archived ones"}.</EmptyState>
        ) : (
          <EmptyState
            title={archived ? "No projects yet" : "No active projects"}
            action={
              canWrite ? (
                <Link href="/projects/new" className="btn-primary">
                  New project
                </Link>
              ) : null
            }
          >
            {canWrite ? "Start with the supply system and design basis; calculation sheets hang off the project." : "Projects your colleagues create will appear here."}
          </EmptyState>
        )
      ) : null}

      {rows.length > 0 && (
        <div className="overflow-x-auto">
          <table className="data-table">
            <thead>
              <tr>
                {COLUMNS.map((c) => (
                  <th
                    key={c.label}
                    scope="col"
                    className={c.className}
                    aria-sort={c.sort && c.sort === sort ? (dir === "asc" ? "ascending" : "descending") : undefined}
                  >
                    {c.sort ? (
                      <button type="button" onClick={() => sortBy(c.sort!)} className="inline-flex items-center gap-1 uppercase hover:text-fen-900">
                        {c.label}
                        <span aria-hidden="true" className={c.sort === sort ? "text-copper-600" : "text-fen-300"}>
                          {c.sort === sort ? (dir === "asc" ? "▲" : "▼") : "↕"}
                        </span>
                        <span className="sr-only">, sort</span>
                      </button>
                    ) : (
                      c.label
                    )}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {rows.map((p) => (
                <tr key={p.id} className={`hover:bg-copper-50/40 ${p.archivedAt ? "text-fen-500" : ""}`}>
                  <td className="font-mono text-sm font-semibold">
                    <Link href={`/projects/${p.id}`} className="text-copper-700 hover:underline">
                      {p.code}
                    </Link>
                  </td>
                  <td>
                    <Link href={`/projects/${p.id}`} className="font-medium text-fen-900 hover:underline">
                      {p.name}
                    </Link>
                    {p.archivedAt && (
                      <span className="ml-2">
                        <StatusBadge tone="archived">Archived</StatusBadge>
                      </span>
                    )}
                  </td>
                  <td>{p.client || <span className="text-fen-400">—</span>}</td>
                  <td className="hidden lg:table-cell">{p.site || <span className="text-fen-400">—</span>}</td>
                  <td className="hidden whitespace-nowrap md:table-cell">{supply(p, systemTypeLabels)}</td>
                  <td className="whitespace-nowrap text-fen-600">
                    <DateTime value={p.updatedAt} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
