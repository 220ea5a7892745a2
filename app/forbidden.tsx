import Link from "next/link";
import { StrutroomMark } from "@/components/brand/mark";

// Rendered (with HTTP 403) when requirePageProject calls forbidden(): a member of the project whose role may not
// open this page. Outsiders never get here; they see not-found.tsx, so a project's existence is not revealed.
export default function Forbidden() {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col items-center justify-center gap-4 p-6 text-center" data-testid="not-allowed">
      <StrutroomMark className="h-10 w-10" />
      <h1 className="text-xl font-semibold">Not allowed</h1>
      <p className="text-board-700">You are on this project&apos;s team, but your role does not open this page. Ask a project owner if you need it.</p>
      <Link href="/projects" className="text-tension underline underline-offset-4">
        Back to your projects
      </Link>
    </main>
  );
}
