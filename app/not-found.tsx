import Link from "next/link";
import { StrutroomMark } from "@/components/brand/mark";

export default function NotFound() {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col items-center justify-center gap-4 p-6 text-center">
      <StrutroomMark className="h-10 w-10" />
      <h1 className="text-xl font-semibold">Nothing here</h1>
      <p className="text-board-700">This page does not exist, or you are not on the team of the project it belongs to.</p>
      <Link href="/projects" className="text-tension underline underline-offset-4">
        Back to your projects
      </Link>
    </main>
  );
}
