import type { Metadata } from "next";
import Link from "next/link";
import { DateTime } from "@/components/ui/date-time";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { StatusBadge } from "@/components/ui/status-badge";
import { listAmpacityTables } from "@/db/queries/ampacity-tables";
import { requirePageActor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { UploadForm } from "./upload-form";

export const metadata: Metadata = { title: "Ampacity tables" };

export default async function AmpacityTablesPage() {
  const actor = await requirePageActor("ampacity.read");
  const tables = await listAmpacityTables(actor.organisationId);
  const manage = can(actor.role, "ampacity.manage");
  // Newest version first within a name: the first row of each name is its latest.
  const latest = tables.filter((t, i) => i === 0 || tables[i - 1]!.name !== t.name).map((t) => ({ name: t.name, version: t.version }));

  return (
    <div className="space-y-8">
      <PageHeader
        title="Ampacity tables"
        description="The current-carrying capacities of the code your organisation works to. Feeder sheets take I_z from an active table with the ambient and grouping corrections, and name the table and version they used."
        actions={
          <a href="/ampacity-tables/template" className="btn-secondary" download>
            Download CSV template
          </a>
        }
      />

      <section aria-labelledby="tables-heading" className="panel overflow-x-auto">
        <h2 id="tables-heading" className="px-5 pt-5 pb-3 text-base font-semibold text-fen-900">
          Tables and versions ({tables.length})
        </h2>
        {tables.length === 0 ? (
          <EmptyState title="No ampacity tables yet">
            {manage ? "Upload the table of your code below; the template shows the columns Ohmstead reads." : "An administrator of your organisation uploads them."}
          </EmptyState>
        ) : (
          <table className="data-table" data-testid="ampacity-tables">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">Version</th>
                <th scope="col" className="text-right">
                  Rows
                </th>
                <th scope="col">Source</th>
                <th scope="col">Uploaded</th>
                <th scope="col">Status</th>
              </tr>
            </thead>
            <tbody>
              {tables.map((t) => (
                <tr key={t.id} className={t.active ? undefined : "text-fen-500"}>
                  <td className="font-medium">
                    <Link href={`/ampacity-tables/${t.id}`} className="text-copper-800 hover:underline">
                      {t.name}
                    </Link>
                  </td>
                  <td className="font-mono">v{t.version}</td>
                  <td className="text-right tabular-nums">{t.rowCount}</td>
                  <td className="max-w-md text-sm">{t.source}</td>
                  <td className="whitespace-nowrap text-xs">
                    <DateTime value={t.createdAt} />
                    <span className="block text-fen-500">{t.createdByName ?? "—"}</span>
                  </td>
                  <td>{t.active ? <StatusBadge tone="pass">Active</StatusBadge> : <StatusBadge tone="archived">Retired</StatusBadge>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      {manage ? (
        <section aria-labelledby="upload-heading" className="panel p-5">
          <h2 id="upload-heading" className="mb-1 text-base font-semibold text-fen-900">
            Upload a table or a new version
          </h2>
          <p className="mb-4 text-sm text-fen-600">
            Every row is checked before anything is stored; a file with any bad row is refused whole, with each problem listed by line and column. Values are your code&apos;s:
            Ohmstead applies the ambient and grouping corrections but does not check the tabulated amps.
          </p>
          <UploadForm latest={latest} />
        </section>
      ) : null}
    </div>
  );
}
