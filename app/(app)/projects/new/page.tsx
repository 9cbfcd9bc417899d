import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageActor } from "@/lib/auth/guard";
import { ProjectForm } from "../project-form";

export const metadata: Metadata = { title: "New project" };

export default async function NewProjectPage() {
  await requirePageActor("project.write");
  return (
    <>
      <PageHeader title="New project" description="The supply system and design basis set the defaults for every calculation sheet in the project." />
      <ProjectForm mode="create" />
    </>
  );
}
