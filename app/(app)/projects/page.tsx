import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/ui/page-header";
import { listProjects } from "@/db/queries/projects";
import { requirePageActor } from "@/lib/auth/guard";
import { can } from "@/lib/auth/roles";
import { projectListQuerySchema, SYSTEM_TYPE_LABELS } from "@/lib/validation/project";
import { ProjectsTable } from "./projects-table";

export const metadata: Metadata = { title: "Projects" };

export default async function ProjectsPage() {
  const actor = await requirePageActor("project.read");
  const query = projectListQuerySchema.parse({});
  const initial = await listProjects(actor.organisationId, query);
  const canWrite = can(actor.role, "project.write");
  return (
    <>
      <PageHeader
        title="Projects"
        description="Each project holds the supply system and design basis its calculation sheets are worked against."
        actions={
          canWrite ? (
            <Link href="/projects/new" className="btn-primary">
              New project
            </Link>
          ) : null
        }
      />
      <ProjectsTable initialQuery={query} initial={initial} canWrite={canWrite} systemTypeLabels={SYSTEM_TYPE_LABELS} />
    </>
  );
}
