"use client";

import useSWR from "swr";
import { FormAlert } from "@/components/forms/form-alert";
import { EmptyState } from "@/components/ui/empty-state";
import { ProjectSheetsTable } from "./project-sheets-table";
import type { SheetRowJson } from "./sheet-row";

async function fetchSheets(url: string): Promise<SheetRowJson[]> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  const body = (await res.json().catch(() => null)) as { sheets?: SheetRowJson[]; error?: { message?: string } } | null;
  if (!res.ok || !body?.sheets) throw new Error(body?.error?.message ?? `The list could not be loaded (HTTP ${res.status})`);
  return body.sheets;
}

/** A sheet list fetched from a JSON route with SWR, refreshed every half minute and on focus. */
export function SheetListLive({ url, caption, emptyTitle, emptyText }: { url: string; caption: string; emptyTitle: string; emptyText: string }) {
  const { data, error, isLoading } = useSWR(url, fetchSheets, { refreshInterval: 30_000, revalidateOnFocus: true });
  if (error) return <FormAlert>{error instanceof Error ? error.message : "The list could not be loaded"}</FormAlert>;
  if (isLoading || !data)
    return (
      <p className="panel p-6 text-sm text-fen-500" role="status">
        Loading…
      </p>
    );
  if (data.length === 0)
    return (
      <div className="panel">
        <EmptyState title={emptyTitle}>{emptyText}</EmptyState>
      </div>
    );
  return <ProjectSheetsTable rows={data} showProject caption={caption} />;
}
