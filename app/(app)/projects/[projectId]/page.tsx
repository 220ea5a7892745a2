import type { Metadata } from "next";
import { LiveInvalidation } from "@/components/live/live-invalidation";
import { DeflectionLimitForm } from "@/components/project/deflection-limit-form";
import { TeamPanel } from "@/components/project/team-panel";
import { InvitePanel } from "@/components/project/invite-panel";
import { ReviewStatePanel } from "@/components/project/review-state-panel";
import { getDb } from "@/db/client";
import { getReviewState } from "@/db/queries/review-state";
import { requirePageProject } from "@/lib/auth/page";
import { realtimeUrl } from "@/lib/realtime/browser-url";

export const metadata: Metadata = { title: "Project overview" };

export default async function ProjectOverviewPage({ params }: PageProps<"/projects/[projectId]">) {
  const { projectId } = await params;
  const { user, project } = await requirePageProject(projectId);
  const canManage = project.abilities["team.manage"];
  const reviewState = await getReviewState({ db: getDb(), projectId: project.id });
  return (
    <div className="flex flex-col gap-6">
      {/* The team and the settings change under an open page: a live event refetches them (components/live/invalidation.ts). */}
      <LiveInvalidation projectId={project.id} realtimeUrl={realtimeUrl()} />
      <ReviewStatePanel projectId={project.id} state={reviewState} />
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <TeamPanel projectId={project.id} canManage={canManage} currentUserId={user.id} />
        <div className="flex flex-col gap-6">
          {canManage ? <InvitePanel projectId={project.id} /> : null}
          {project.abilities["project.settings"] ? <DeflectionLimitForm projectId={project.id} deflectionLimit={project.deflectionLimit} /> : null}
        </div>
      </div>
    </div>
  );
}
