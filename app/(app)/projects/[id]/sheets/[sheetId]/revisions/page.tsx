import type { Metadata } from "next";
import { Breadcrumbs } from "@/components/ui/breadcrumbs";
import Link from "next/link";
import { SheetStatusBadge } from "@/components/sheets/editor/status";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";
import { sig } from "@/lib/engine/format";
import { sheetKindName } from "@/lib/sheets/kinds";
import { diffRevisions } from "@/lib/sheets/service";
import { displayUnit, quantityOf, type UnitSystem } from "@/lib/sheets/units";
import type { JsonChange } from "@/lib/sheets/diff";
import { loadSheetOr404, or404 } from "../load";

export const metadata: Metadata = { title: "Compare revisions" };

/** Result paths that are whole series (curves, profiles): reported as one line each, not point by point. */
const SERIES = /^results\.(curve|profile|surfaces|lines|contingencies|passing|failing|paths|perPhase)\.(\d+)/;
const MAX_ROWS = 120;

function show(v: unknown, kind: string, path: string, system: UnitSystem): string {
  if (v === undefined) return "—";
  if (typeof v === "number") {
    const q = quantityOf(kind, path);
    if (q) {
      const u = displayUnit(q, system);
      return `${sig(u.fromSI(v), 5)} ${u.label}`;
    }
    return sig(v, 5);
  }
  if (typeof v === "string") return v;
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (v === null) return "empty";
  return JSON.stringify(v).slice(0, 120);
}

function summarise(changes: readonly JsonChange[]): { rows: JsonChange[]; series: string[] } {
  const series = new Set<string>();
  const rows: JsonChange[] = [];
  for (const c of changes) {
    const m = SERIES.exec(c.path);
    if (m) series.add(m[1]!);
    else rows.push(c);
  }
  return { rows, series: [...series] };
}

function ChangeTable({ title, changes, kind, system, inputs }: { title: string; changes: readonly JsonChange[]; kind: string; system: UnitSystem; inputs: boolean }) {
  const { rows, series } = inputs ? { rows: [...changes], series: [] } : summarise(changes);
  return (
    <section className="panel overflow-hidden" aria-label={title}>
      <h2 className="border-b border-fen-200 px-4 py-3 text-sm font-semibold text-fen-900">
        {title} <span className="font-normal text-fen-500">({changes.length === 0 ? "none" : rows.length + series.length})</span>
      </h2>
      {rows.length === 0 && series.length === 0 ? (
        <p className="px-4 py-3 text-sm text-fen-500">No changes.</p>
      ) : (
        <table className="data-table">
          <thead>
            <tr>
              <th>Field</th>
              <th>Before</th>
              <th>After</th>
            </tr>
          </thead>
          <tbody>
            {rows.slice(0, MAX_ROWS).map((c) => (
              <tr key={c.path} data-change={c.path}>
                <td className="font-mono text-xs">{c.path || "(whole value)"}</td>
                <td className="text-signal-700">{c.kind === "added" ? "—" : show(c.from, kind, c.path, system)}</td>
                <td className="text-verdigris-700">{c.kind === "removed" ? "—" : show(c.to, kind, c.path, system)}</td>
              </tr>
            ))}
            {series.map((s) => (
              <tr key={s}>
                <td className="font-mono text-xs">results.{s}</td>
                <td colSpan={2} className="text-fen-600">
                  The series changed (see the sheet for the values).
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {rows.length > MAX_ROWS ? <p className="px-4 py-2 text-xs text-fen-500">{rows.length - MAX_ROWS} more changes not shown.</p> : null}
    </section>
  );
}

export default async function RevisionsPage({ params, searchParams }: { params: Promise<{ id: string; sheetId: string }>; searchParams: Promise<{ from?: string; to?: string }> }) {
  const actor = await requirePageActor("sheet.read");
  const { id, sheetId } = await params;
  const { sheet, project } = await loadSheetOr404(actor, id, sheetId);
  const sp = await searchParams;
  const revs = sheet.revisions;
  const last = revs[revs.length - 1]!;
  const prev = revs[revs.length - 2] ?? last;
  const pick = (raw: string | undefined, fallback: number) => (raw && /^\d{1,6}$/.test(raw) && revs.some((r) => r.ordinal === Number(raw)) ? Number(raw) : fallback);
  const from = pick(sp.from, prev.ordinal);
  const to = pick(sp.to, last.ordinal);
  const diff = await or404(diffRevisions(actor, sheet.id, from, to));
  const base = `/projects/${project.id}/sheets/${sheet.id}`;

  return (
    <>
      <Breadcrumbs
        items={[
          { label: "Projects", href: "/projects" },
          { label: project.code, href: `/projects/${project.id}`, mono: true },
          { label: sheet.tag, href: base, mono: true },
          { label: "Revisions" },
        ]}
      />
      <PageHeader eyebrow={`${sheet.tag} · ${sheetKindName(sheet.kind)}`} title={`Compare revisions of ${sheet.title}`} />

      <form method="get" className="panel mb-6 flex flex-wrap items-end gap-4 p-4">
        {(["from", "to"] as const).map((name) => (
          <div key={name}>
            <label htmlFor={`rev-${name}`} className="field-label">
              {name === "from" ? "Older revision" : "Newer revision"}
            </label>
            <select id={`rev-${name}`} name={name} defaultValue={String(name === "from" ? from : to)} className="field-input">
              {revs.map((r) => (
                <option key={r.ordinal} value={r.ordinal}>
                  Rev {r.label} ({r.status.replace("_", " ")}, {r.authorName})
                </option>
              ))}
            </select>
          </div>
        ))}
        <button type="submit" className="btn-primary">
          Compare
        </button>
      </form>

      <div className="mb-4 flex flex-wrap items-center gap-3 text-sm text-fen-700">
        <Link href={`${base}?rev=${diff.from.ordinal}`} className="inline-flex items-center gap-2 hover:underline">
          <span className="font-mono font-semibold">Rev {diff.from.label}</span> <SheetStatusBadge status={diff.from.status} />
        </Link>
        <span aria-hidden="true">→</span>
        <Link href={`${base}?rev=${diff.to.ordinal}`} className="inline-flex items-center gap-2 hover:underline">
          <span className="font-mono font-semibold">Rev {diff.to.label}</span> <SheetStatusBadge status={diff.to.status} />
        </Link>
      </div>

      <div className="space-y-6">
        <ChangeTable title="Changed inputs" changes={diff.inputs} kind={sheet.kind} system={project.unitSystem} inputs />
        <ChangeTable title="Changed results" changes={diff.results} kind={sheet.kind} system={project.unitSystem} inputs={false} />
      </div>
    </>
  );
}
