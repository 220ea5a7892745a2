import type { ReactNode } from "react";
import { StrutroomWordmark } from "@/components/brand/mark";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-8 p-6">
      <StrutroomWordmark />
      <div className="w-full max-w-sm rounded-xl border border-board-200 bg-white p-6 shadow-sm">{children}</div>
      <p className="max-w-sm text-center text-xs text-board-700">The shared review board for steel space-truss roofs.</p>
    </main>
  );
}
