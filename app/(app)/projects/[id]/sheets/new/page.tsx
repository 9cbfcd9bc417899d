import type { Metadata } from "next";
import { Breadcrumbs } from "@/components/ui/breadcrumbs";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";
import { isCalcKind } from "@/lib/engine";
import { SHEET_KINDS } from "@/lib/sheets/kinds";
import { listProjectSheets } from "@/lib/sheets/service";
import { loadProjectOr404 } from "../../load";
import { NewSheetForm } from "./new-sheet-form";

export const metadata: Metadata = { title: "New sheet" };

export default async function NewSheetPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ kind?: string | string[] }> }) {
  const actor = await requirePageActor("sheet.write");
  const project = await loadProjectOr404(actor, (await params).id);
  const wanted = (await searchParams).kind;
  const kinds = SHEET_KINDS.filter((k) => isCalcKind(k.kind)).map((k) => k.kind);
  const taken = (await listProjectSheets(actor, project.id)).map((s) => s.tag);

  return (
    <>
      <Breadcrumbs items={[{ label: "Projects", href: "/projects" }, { label: project.code, href: `/projects/${project.id}`, mono: true }, { label: "New sheet" }]} />
      <PageHeader eyebrow={project.code} title="New calculation sheet" description="Choose what to calculate; the sheet starts from the project's voltage, frequency, ambient and standard family." />
      {project.archivedAt ? (
        <p role="status" className="rounded-lg border border-fen-200 bg-fen-100 px-4 py-3 text-sm text-fen-700">
          This project is archived. Restore it before adding sheets.
        </p>
      ) : (
        <NewSheetForm
          projectId={project.id}
          kinds={kinds}
          initialKind={typeof wanted === "string" && kinds.includes(wanted) ? wanted : (kinds[0] ?? "busbar-rating")}
          takenTags={taken}
          basis={{
            unitSystem: project.unitSystem,
            systemVoltage: project.systemVoltage,
            systemType: project.systemType,
            frequency: project.frequency,
            designAmbientC: project.designAmbientC,
            altitudeM: project.altitudeM,
            standardFamily: project.standardFamily,
          }}
        />
      )}
    </>
  );
}
