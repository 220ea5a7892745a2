import type { Metadata } from "next";
import { ModelsWorkspace } from "@/components/models/models-workspace";
import { ProjectHeader } from "@/components/project/project-header";
import { ProjectNav } from "@/components/project/project-nav";
import { requirePageProject } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Models" };

export default async function ModelsPage({ params }: PageProps<"/projects/[projectId]/models">) {
  const { projectId } = await params;
  const { project } = await requirePageProject(projectId);
  return (
    <div className="flex flex-col gap-6">
      <ProjectHeader project={project} />
      <ProjectNav projectId={project.id} current="models" />
      <ModelsWorkspace projectId={project.id} canEdit={project.abilities["model.edit"] && project.abilities["analysis.run"]} />
    </div>
  );
}
