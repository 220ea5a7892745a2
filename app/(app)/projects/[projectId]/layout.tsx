import { ProjectHeader } from "@/components/project/project-header";
import { ProjectNav } from "@/components/project/project-nav";
import { PROJECT_SECTIONS } from "@/components/project/project-sections";
import { requirePageProject } from "@/lib/auth/page";
import { capturedMailPageEnabled } from "@/lib/mail/captured";

/**
 * Every project page: the membership guard (outsiders see "not found"), the header and the section tabs. The
 * membership is read once per request and shared with the page (lib/auth/page.ts), which checks its own action.
 */
export default async function ProjectLayout({ params, children }: LayoutProps<"/projects/[projectId]">) {
  const { projectId } = await params;
  const { project } = await requirePageProject(projectId);
  const showMail = capturedMailPageEnabled() && project.abilities["mail.viewCaptured"];
  const sections = PROJECT_SECTIONS.map((s) => s.segment).filter((segment) => segment !== "mail" || showMail);
  return (
    <div className="flex flex-col gap-4">
      <ProjectHeader project={project} />
      <ProjectNav projectId={project.id} sections={sections} />
      {children}
    </div>
  );
}
