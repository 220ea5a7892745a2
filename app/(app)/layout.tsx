import Link from "next/link";
import type { ReactNode } from "react";
import { StrutroomWordmark } from "@/components/brand/mark";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { requirePageUser } from "@/lib/auth/session";

export default async function AppLayout({ children }: { children: ReactNode }) {
  const user = await requirePageUser("/projects");
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-board-200 bg-white">
        <div className="mx-auto flex max-w-[96rem] flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3 sm:px-6">
          <Link href="/projects" aria-label="Strutroom: your projects">
            <StrutroomWordmark />
          </Link>
          <nav className="flex gap-4 text-sm text-board-700" aria-label="Main">
            <Link href="/projects" className="hover:text-board-900">
              Projects
            </Link>
            <Link href="/account" className="hover:text-board-900">
              Account
            </Link>
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="text-board-700" data-testid="signed-in-as">
              {user.name}
            </span>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main className="mx-auto w-full max-w-[96rem] flex-1 px-4 py-6 sm:px-6">{children}</main>
    </div>
  );
}
