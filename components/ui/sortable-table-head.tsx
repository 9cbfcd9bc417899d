"use client";

import { flexRender, type Table } from "@tanstack/react-table";

/**
 * The header row of a sortable @tanstack/react-table: each column title is a button that
 * cycles its sort order, announced to assistive technology with aria-sort.
 */
export function SortableTableHead<T>({ table, thClassName }: { table: Table<T>; thClassName?: string }) {
  return (
    <thead>
      {table.getHeaderGroups().map((hg) => (
        <tr key={hg.id}>
          {hg.headers.map((h) => {
            const sorted = h.column.getIsSorted();
            return (
              <th key={h.id} aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"} className={thClassName}>
                <button type="button" className="inline-flex items-center gap-1 uppercase" onClick={h.column.getToggleSortingHandler()}>
                  {flexRender(h.column.columnDef.header, h.getContext())}
                  <span aria-hidden="true" className="text-fen-400">
                    {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}
                  </span>
                </button>
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}
