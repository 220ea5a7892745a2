"use client";

import { useState } from "react";
import { apiFetch } from "@/lib/http/fetcher";
import { Button, FormMessage } from "@/components/ui/form";

/** "Sign out everywhere else": ends every other session of this account (a lost phone, a shared computer). */
export function SessionsForm() {
  const [message, setMessage] = useState<{ text: string; tone: "error" | "success" }>();
  const [busy, setBusy] = useState(false);

  async function signOutElsewhere() {
    setBusy(true);
    setMessage(undefined);
    try {
      await apiFetch("/api/account/sessions", { method: "DELETE" });
      setMessage({ text: "Every other session is signed out. This one stays signed in.", tone: "success" });
    } catch (error) {
      setMessage({ text: error instanceof Error ? error.message : "Something went wrong. Please try again.", tone: "error" });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="flex flex-col gap-3 rounded-xl border border-board-200 bg-white p-5" data-testid="sessions-form">
      <h2 className="text-lg font-semibold">Sessions</h2>
      <p className="text-sm text-board-700">Signed in somewhere you no longer use? End every session but this one. Changing your password does the same.</p>
      <FormMessage message={message?.text} tone={message?.tone} testId="sessions-message" />
      <div>
        <Button type="button" onClick={signOutElsewhere} disabled={busy}>
          Sign out everywhere else
        </Button>
      </div>
    </section>
  );
}
