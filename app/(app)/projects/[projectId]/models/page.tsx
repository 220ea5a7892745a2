import type { Metadata } from "next";
import { LiveInvalidation } from "@/components/live/live-invalidation";
import { ModelsWorkspace } from "@/components/models/models-workspace";
import { requirePageProject } from "@/lib/auth/page";
import { realtimeUrl } from "@/lib/realtime/browser-url";

export const metadata: Metadata = { title: "Models" };

export default async function ModelsPage({ params }: PageProps<"/projects/[projectId]/models">) {
  const { projectId } = await params;
  const { project } = await requirePageProject(projectId);
  return (
    <div className="flex flex-col gap-6">
      <LiveInvalidation projectId={project.id} realtimeUrl={realtimeUrl()} />
      <ModelsWorkspace projectId={project.id} canEdit={project.abilities["model.edit"] && project.abilities["analysis.run"]} />
    </div>
  );
}
