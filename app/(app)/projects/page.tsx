import type { Metadata } from "next";
import { ProjectList } from "@/components/project/project-list";

export const metadata: Metadata = { title: "Projects" };

export default function ProjectsPage() {
  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-2xl font-semibold">Your projects</h1>
      <ProjectList />
    </div>
  );
}
