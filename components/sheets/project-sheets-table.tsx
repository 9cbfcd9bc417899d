"use client";

import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type FilterFn,
  type SortingState,
} from "@tanstack/react-table";
import Link from "next/link";
import { useId, useMemo, useState } from "react";
import type { SheetStatus } from "@/db/schema/sheets";
import { DateTime } from "@/components/ui/date-time";
import { SheetStatusBadge, STATUS_LABELS } from "./editor/status";
import { sheetHref, type SheetRowJson } from "./sheet-row";
import { SortableTableHead } from "@/components/ui/sortable-table-head";

const col = createColumnHelper<SheetRowJson>();

const matchesText: FilterFn<SheetRowJson> = (row, _id, value: string) => {
  const q = value.trim().toLowerCase();
  if (!q) return true;
  const r = row.original;
  return [r.tag, r.title, r.kindName, r.authorName, r.checkedByName ?? "", r.projectCode, r.projectName].some((s) => s.toLowerCase().includes(q));
};

/**
 * A project's sheets (or any list of sheets) as a sortable, filterable table: kind, tag,
 * title, revision, status, author, checker and last update. Filtering is by text and by
 * status; sorting by any column header.
 */
export function ProjectSheetsTable({ rows, showProject = false, caption }: { rows: readonly SheetRowJson[]; showProject?: boolean; caption?: string }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [text, setText] = useState("");
  const [status, setStatus] = useState<SheetStatus | "">("");
  const searchId = useId();
  const statusId = useId();

  const columns = useMemo(
    () => [
      ...(showProject
        ? [
            col.accessor("projectCode", {
              header: "Project",
              cell: (c) => (
                <span title={c.row.original.projectName} className="font-mono text-xs">
                  {c.getValue()}
                </span>
              ),
            }),
          ]
        : []),
      col.accessor("tag", {
        header: "Tag",
        cell: (c) => (
          <Link href={sheetHref(c.row.original)} className="font-mono font-semibold text-copper-700 hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor("kindName", { header: "Kind" }),
      col.accessor("title", {
        header: "Title",
        cell: (c) => (
          <Link href={sheetHref(c.row.original)} className="hover:underline">
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor("label", {
        header: "Revision",
        cell: (c) => (
          <span className="font-mono">
            {c.getValue()}
            {c.row.original.approvedLabel && c.row.original.approvedLabel !== c.getValue() ? (
              <span className="ml-1 text-xs text-fen-500">(in force: {c.row.original.approvedLabel})</span>
            ) : null}
          </span>
        ),
      }),
      col.accessor("status", { header: "Status", cell: (c) => <SheetStatusBadge status={c.getValue()} />, filterFn: "equals" }),
      col.accessor("authorName", { header: "Author" }),
      col.accessor("checkedByName", { header: "Checked by", cell: (c) => c.getValue() ?? "—" }),
      col.accessor("updatedAt", { header: "Updated", cell: (c) => <DateTime value={c.getValue()} /> }),
    ],
    [showProject],
  );

  const columnFilters = useMemo(() => (status ? [{ id: "status", value: status }] : []), [status]);
  const table = useReactTable({
    data: rows as SheetRowJson[],
    columns,
    state: { sorting, globalFilter: text, columnFilters },
    onSortingChange: setSorting,
    globalFilterFn: matchesText,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const shown = table.getRowModel().rows;

  return (
    <div className="panel overflow-hidden">
      <div className="flex flex-wrap items-end gap-3 border-b border-fen-200 px-4 py-3">
        <div className="min-w-48 flex-1">
          <label htmlFor={searchId} className="field-label">
            Filter
          </label>
          <input id={searchId} className="field-input" type="search" placeholder="Tag, title, kind, person" value={text} onChange={(e) => setText(e.target.value)} />
        </div>
        <div>
          <label htmlFor={statusId} className="field-label">
            Status
          </label>
          <select id={statusId} className="field-input" value={status} onChange={(e) => setStatus(e.target.value as SheetStatus | "")}>
            <option value="">Any</option>
            {(Object.keys(STATUS_LABELS) as SheetStatus[]).map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <p className="pb-2 text-xs text-fen-500" aria-live="polite">
          {shown.length} of {rows.length} sheets
        </p>
      </div>
      <div className="overflow-x-auto">
        <table className="data-table">
          {caption ? <caption className="sr-only">{caption}</caption> : null}
          <SortableTableHead table={table} />
          <tbody>
            {shown.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="py-6 text-center text-fen-500">
                  {rows.length === 0 ? "No sheets yet." : "No sheet matches the filter."}
                </td>
              </tr>
            ) : (
              shown.map((r) => (
                <tr key={r.id} data-sheet={r.original.tag}>
                  {r.getVisibleCells().map((c) => (
                    <td key={c.id}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
