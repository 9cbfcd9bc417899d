"use client";

import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type FilterFn,
  type SortingState,
} from "@tanstack/react-table";
import { useId, useMemo, useState } from "react";
import type { UnitSystem } from "@/db/schema/projects";
import { cToTemp, mToLength } from "@/lib/engine/units";
import type { ScheduleTableRow } from "./table-row";
import { SortableTableHead } from "@/components/ui/sortable-table-head";

const col = createColumnHelper<ScheduleTableRow>();

const matchesText: FilterFn<ScheduleTableRow> = (row, _id, value: string) => {
  const q = value.trim().toLowerCase();
  if (!q) return true;
  const r = row.original;
  return [r.tag, r.from, r.to, r.size, r.installation, r.material, r.insulation, ...r.reasons].some((s) => s.toLowerCase().includes(q));
};

const PAGE_SIZES = [25, 50, 100, 250] as const;

const n = (x: number, digits = 3) => (Number.isFinite(x) ? Number(x.toPrecision(digits)).toLocaleString("en-GB", { maximumFractionDigits: 6 }) : "—");
const fixed = (x: number, d: number) => (Number.isFinite(x) ? x.toFixed(d) : "—");

function Num({ children, warn = false }: { children: string; warn?: boolean }) {
  return <span className={`tabular-nums ${warn ? "font-semibold text-signal-700" : ""}`}>{children}</span>;
}

/**
 * The computed rows of a schedule: sortable by every column, filtered by text and by
 * result, a page at a time (a schedule may have 20 000 rows). Lengths and temperatures in
 * the project's units.
 */
export function ScheduleResultsTable({ rows, unitSystem }: { rows: readonly ScheduleTableRow[]; unitSystem: UnitSystem }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [text, setText] = useState("");
  const [result, setResult] = useState<"" | "pass" | "fail">("");
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize: 50 });
  const searchId = useId();
  const resultId = useId();
  const sizeId = useId();
  const imperial = unitSystem === "imperial";
  const lenUnit = imperial ? "ft" : "m";
  const tUnit = imperial ? "°F" : "°C";
  const len = (m: number) => (imperial ? mToLength(m, "ft") : m);
  const temp = (c: number) => (imperial ? cToTemp(c, "F") : c);

  const columns = useMemo(
    () => [
      col.accessor("row", { header: "Row", cell: (c) => <span className="tabular-nums text-fen-500">{c.getValue()}</span> }),
      col.accessor("tag", { header: "Tag", cell: (c) => <span className="whitespace-nowrap font-mono font-semibold">{c.getValue()}</span> }),
      col.accessor((r) => `${r.from} → ${r.to}`, {
        id: "route",
        header: "From → to",
        cell: (c) => (
          <span className="text-xs text-fen-700">
            {c.row.original.from || "—"} <span aria-hidden="true">→</span>
            <span className="sr-only">to</span> {c.row.original.to || "—"}
          </span>
        ),
      }),
      col.accessor((r) => r.size_m2 * r.parallel, {
        id: "size",
        header: "Size",
        cell: (c) => (
          <span className="whitespace-nowrap">
            {c.row.original.parallel > 1 ? `${c.row.original.parallel} × ` : ""}
            {c.row.original.size} <span className="text-xs text-fen-500">{c.row.original.material === "aluminium" ? "Al" : "Cu"} {c.row.original.insulation.toUpperCase()}</span>
          </span>
        ),
      }),
      col.accessor("length_m", { header: `Length (${lenUnit})`, cell: (c) => <Num>{n(len(c.getValue()), 4)}</Num> }),
      col.accessor("current_A", { header: "Load (A)", cell: (c) => <Num>{n(c.getValue(), 4)}</Num> }),
      col.accessor("ampacity_A", {
        header: "Ampacity (A)",
        cell: (c) => (
          <span className="whitespace-nowrap">
            <Num>{n(c.getValue(), 4)}</Num>{" "}
            <span className="text-xs text-fen-500" title={c.row.original.ampacitySource === "table" ? `Table, installation method ${c.row.original.installation}` : "As given in the file"}>
              {c.row.original.ampacitySource === "table" ? `table ${c.row.original.installation}` : "given"}
            </span>
          </span>
        ),
      }),
      col.accessor("utilisation", { header: "Used (%)", cell: (c) => <Num warn={c.getValue() > 1}>{fixed(c.getValue() * 100, 0)}</Num> }),
      col.accessor("theta_C", {
        header: `Conductor (${tUnit})`,
        cell: (c) => (
          <span className="whitespace-nowrap">
            <Num warn={c.getValue() > c.row.original.thetaMax_C + 1e-9}>{fixed(temp(c.getValue()), 1)}</Num>
            <span className="text-xs text-fen-500"> / {fixed(temp(c.row.original.thetaMax_C), 0)}</span>
          </span>
        ),
      }),
      col.accessor("drop_V", { header: "Drop (V)", cell: (c) => <Num>{fixed(c.getValue(), 2)}</Num> }),
      col.accessor("drop_percent", {
        header: "Drop (%)",
        cell: (c) => (
          <span className="whitespace-nowrap">
            <Num warn={c.getValue() > c.row.original.limit_percent}>{fixed(c.getValue(), 2)}</Num>
            <span className="text-xs text-fen-500"> / {n(c.row.original.limit_percent)}</span>
          </span>
        ),
      }),
      col.accessor((r) => (r.pass ? "pass" : "fail"), {
        id: "result",
        header: "Result",
        filterFn: "equals",
        cell: (c) => {
          const r = c.row.original;
          return (
            <div className="min-w-56">
              <span className={`badge ${r.pass ? "bg-verdigris-100 text-verdigris-700" : "bg-signal-100 text-signal-700"}`}>{r.pass ? "Pass" : "Fail"}</span>
              {r.reasons.length ? (
                <ul className="mt-1 space-y-0.5 text-xs text-signal-700">
                  {r.reasons.map((x) => (
                    <li key={x}>{x}</li>
                  ))}
                </ul>
              ) : null}
              {!r.pass && r.minimumSize ? <p className="mt-0.5 text-xs text-fen-600">Drop met from {r.minimumSize}</p> : null}
              {r.warnings.length ? (
                <details className="mt-1 text-xs text-amberline-700">
                  <summary className="cursor-pointer">
                    {r.warnings.length} note{r.warnings.length === 1 ? "" : "s"}
                  </summary>
                  <ul className="mt-0.5 space-y-0.5">
                    {r.warnings.map((w) => (
                      <li key={w}>{w}</li>
                    ))}
                  </ul>
                </details>
              ) : null}
            </div>
          );
        },
      }),
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [imperial],
  );

  const columnFilters = useMemo(() => (result ? [{ id: "result", value: result }] : []), [result]);
  const table = useReactTable({
    data: rows as ScheduleTableRow[],
    columns,
    state: { sorting, globalFilter: text, columnFilters, pagination },
    onSortingChange: setSorting,
    onPaginationChange: setPagination,
    globalFilterFn: matchesText,
    autoResetPageIndex: true,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
  });
  const filtered = table.getFilteredRowModel().rows.length;
  const shown = table.getRowModel().rows;
  const page = table.getState().pagination;
  const first = filtered === 0 ? 0 : page.pageIndex * page.pageSize + 1;
  const last = Math.min(filtered, (page.pageIndex + 1) * page.pageSize);

  return (
    <div className="panel overflow-hidden">
      <div className="flex flex-wrap items-end gap-3 border-b border-fen-200 px-4 py-3">
        <div className="min-w-48 flex-1">
          <label htmlFor={searchId} className="field-label">
            Filter
          </label>
          <input id={searchId} className="field-input" type="search" placeholder="Tag, from, to, size, method, reason" value={text} onChange={(e) => setText(e.target.value)} />
        </div>
        <div>
          <label htmlFor={resultId} className="field-label">
            Result
          </label>
          <select id={resultId} className="field-input" value={result} onChange={(e) => setResult(e.target.value as "" | "pass" | "fail")}>
            <option value="">Any</option>
            <option value="pass">Pass</option>
            <option value="fail">Fail</option>
          </select>
        </div>
        <p className="pb-2 text-xs text-fen-500" aria-live="polite">
          {filtered} of {rows.length} rows
        </p>
      </div>
      <div className="overflow-x-auto">
        <table className="data-table">
          <caption className="sr-only">Computed rows of the cable schedule</caption>
          <SortableTableHead table={table} thClassName="whitespace-nowrap" />
          <tbody>
            {shown.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="py-6 text-center text-fen-500">
                  {rows.length === 0 ? "No row of the file could be computed." : "No row matches the filter."}
                </td>
              </tr>
            ) : (
              shown.map((r) => (
                <tr key={r.id} data-row={r.original.row} data-result={r.original.pass ? "pass" : "fail"} className={r.original.pass ? "" : "bg-signal-50/40"}>
                  {r.getVisibleCells().map((c) => (
                    <td key={c.id}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      <nav aria-label="Result pages" className="flex flex-wrap items-center gap-3 border-t border-fen-200 px-4 py-3 text-sm">
        <button type="button" className="btn-secondary" onClick={() => table.setPageIndex(0)} disabled={!table.getCanPreviousPage()}>
          First
        </button>
        <button type="button" className="btn-secondary" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
          Previous
        </button>
        <span className="tabular-nums text-fen-700" aria-live="polite">
          Rows {first}–{last} of {filtered} · page {filtered === 0 ? 0 : page.pageIndex + 1} of {table.getPageCount()}
        </span>
        <button type="button" className="btn-secondary" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
          Next
        </button>
        <button type="button" className="btn-secondary" onClick={() => table.setPageIndex(table.getPageCount() - 1)} disabled={!table.getCanNextPage()}>
          Last
        </button>
        <label htmlFor={sizeId} className="ml-auto text-fen-600">
          Rows per page
        </label>
        <select id={sizeId} className="field-input mt-0 w-24" value={page.pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
          {PAGE_SIZES.map((s) => (
            <option key={s} value={s}>
              {s}
            </option>
          ))}
        </select>
      </nav>
    </div>
  );
}
