import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";
import { toProjectFormValues } from "@/lib/validation/project";
import { ProjectForm } from "../../project-form";
import { loadProjectOr404 } from "../load";

export const metadata: Metadata = { title: "Edit project" };

export default async function EditProjectPage({ params }: { params: Promise<{ id: string }> }) {
  const actor = await requirePageActor("project.write");
  const project = await loadProjectOr404(actor, (await params).id);
  if (project.archivedAt) {
    return (
      <>
        <PageHeader eyebrow={project.code} title="Edit project" />
        <div role="status" className="panel p-6 text-sm text-fen-700">
          <p>This project is archived. Restore it before editing.</p>
          <Link href={`/projects/${project.id}`} className="btn-secondary mt-4">
            Back to the project
          </Link>
        </div>
      </>
    );
  }
  return (
    <>
      <PageHeader eyebrow={project.code} title={`Edit ${project.name}`} description={`Version ${project.version}. If someone else saves first, your save is refused and nothing is overwritten.`} />
      <ProjectForm mode="edit" id={project.id} version={project.version} initial={toProjectFormValues(project)} />
    </>
  );
}
