import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Breadcrumbs } from "@/components/ui/breadcrumbs";
import { DateTime } from "@/components/ui/date-time";
import { PageHeader } from "@/components/ui/page-header";
import { StatusBadge } from "@/components/ui/status-badge";
import { findAmpacityTableDetail } from "@/db/queries/ampacity-tables";
import { requirePageActor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { areaToKcmil } from "@/lib/engine/units";
import { AppError } from "@/lib/errors";
import { RetireRestore } from "./retire-restore";

export const metadata: Metadata = { title: "Ampacity table" };

const mm2 = (a: number) => String(Number((a * 1e6).toPrecision(4)));

export default async function AmpacityTablePage({ params }: { params: Promise<{ id: string }> }) {
  const actor = await requirePageActor("ampacity.read");
  const { id } = await params;
  if (!/^\d{1,10}$/.test(id)) notFound();
  const t = await findAmpacityTableDetail(actor.organisationId, Number(id)).catch((e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  });
  const manage = can(actor.role, "ampacity.manage");

  return (
    <>
      <Breadcrumbs items={[{ label: "Ampacity tables", href: "/ampacity-tables" }, { label: `${t.name} v${t.version}` }]} />
      <PageHeader
        eyebrow={`Version ${t.version} of ${t.versions.length}`}
        title={
          <span className="flex flex-wrap items-center gap-3">
            {t.name} v{t.version}
            {t.active ? <StatusBadge tone="pass">Active</StatusBadge> : <StatusBadge tone="archived">Retired</StatusBadge>}
          </span>
        }
        description={t.source}
        actions={
          <>
            <a href={`/ampacity-tables/${t.id}/file`} className="btn-secondary" download>
              Download the file as uploaded
            </a>
            {manage ? <RetireRestore id={t.id} active={t.active} label={`${t.name} v${t.version}`} /> : null}
          </>
        }
      />

      <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <section aria-labelledby="rows-heading" className="panel overflow-x-auto">
          <h2 id="rows-heading" className="px-5 pt-5 pb-3 text-base font-semibold text-fen-900">
            Rows ({t.rowCount})
          </h2>
          <table className="data-table" data-testid="ampacity-rows">
            <thead>
              <tr>
                <th scope="col">Size</th>
                <th scope="col" className="text-right">
                  mm²
                </th>
                <th scope="col" className="text-right">
                  kcmil
                </th>
                <th scope="col">Material</th>
                <th scope="col">Insulation</th>
                <th scope="col">Installation</th>
                <th scope="col" className="text-right">
                  Ref. ambient (°C)
                </th>
                <th scope="col" className="text-right">
                  Conductor max (°C)
                </th>
                <th scope="col" className="text-right">
                  Amps
                </th>
              </tr>
            </thead>
            <tbody>
              {t.rows.map((r, i) => (
                <tr key={i}>
                  <td>{r.label ?? `${mm2(r.size_m2)} mm²`}</td>
                  <td className="text-right tabular-nums">{mm2(r.size_m2)}</td>
                  <td className="text-right tabular-nums text-fen-500">{Number(areaToKcmil(r.size_m2).toPrecision(4))}</td>
                  <td>{r.material}</td>
                  <td className="uppercase">{r.insulation}</td>
                  <td className="font-mono">{r.installation}</td>
                  <td className="text-right tabular-nums">{Number(r.referenceAmbient_C.toPrecision(4))}</td>
                  <td className="text-right tabular-nums">{Number(r.conductorMax_C.toPrecision(4))}</td>
                  <td className="text-right font-semibold tabular-nums">{r.ampacity_A}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>

        <aside className="space-y-6">
          <section aria-labelledby="file-heading" className="panel p-5">
            <h2 id="file-heading" className="mb-3 text-base font-semibold text-fen-900">
              File
            </h2>
            <dl className="space-y-2 text-sm">
              <div>
                <dt className="text-fen-500">Name</dt>
                <dd className="break-all">{t.filename}</dd>
              </div>
              <div>
                <dt className="text-fen-500">Size</dt>
                <dd>{t.sizeBytes < 1024 ? `${t.sizeBytes} bytes` : `${(t.sizeBytes / 1024).toFixed(1)} KB`}</dd>
              </div>
              <div>
                <dt className="text-fen-500">SHA-256</dt>
                <dd className="break-all font-mono text-xs" data-testid="file-sha256">
                  {t.fileSha256}
                </dd>
              </div>
              <div>
                <dt className="text-fen-500">Uploaded</dt>
                <dd>
                  <DateTime value={t.createdAt} /> by {t.createdByName ?? "—"}
                </dd>
              </div>
              {t.retiredAt ? (
                <div>
                  <dt className="text-fen-500">Retired</dt>
                  <dd>
                    <DateTime value={t.retiredAt} />
                  </dd>
                </div>
              ) : null}
            </dl>
          </section>
          <section aria-labelledby="versions-heading" className="panel p-5">
            <h2 id="versions-heading" className="mb-3 text-base font-semibold text-fen-900">
              Versions of “{t.name}”
            </h2>
            <ul className="space-y-1 text-sm">
              {t.versions.map((v) => (
                <li key={v.id} className="flex items-center gap-2">
                  {v.id === t.id ? (
                    <span className="font-mono font-semibold" aria-current="page">
                      v{v.version}
                    </span>
                  ) : (
                    <Link href={`/ampacity-tables/${v.id}`} className="font-mono text-copper-800 hover:underline">
                      v{v.version}
                    </Link>
                  )}
                  <DateTime value={v.createdAt} dateOnly />
                  {v.active ? null : <StatusBadge tone="archived">Retired</StatusBadge>}
                </li>
              ))}
            </ul>
            <p className="mt-3 text-xs text-fen-500">
              Retiring a version takes it off the choices for new work. Sheets that used it keep their own copy of the rows they used, so their results do not change.
            </p>
          </section>
        </aside>
      </div>
    </>
  );
}
