"use client";

import type { FieldValues, Path, UseFormReturn } from "react-hook-form";
import type { InputHTMLAttributes, ReactNode } from "react";
import { ApiError } from "@/lib/http/fetcher";

/** A labelled input with its error message right beside it. */
export function Field({ label, error, hint, id, ...input }: { label: string; error?: string; hint?: ReactNode; id: string } & InputHTMLAttributes<HTMLInputElement>) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-board-800">
        {label}
      </label>
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className="rounded-md border border-board-200 bg-white px-3 py-2 text-board-900 shadow-sm outline-none focus:border-tension aria-invalid:border-clash"
        {...input}
      />
      {hint && !error ? <p className="text-xs text-board-700">{hint}</p> : null}
      <FieldError message={error} id={`${id}-error`} />
    </div>
  );
}

/** One error line beside a field or control (announced to screen readers); nothing when there is no message. */
export function FieldError({ message, id }: { message?: string; id?: string }) {
  if (!message) return null;
  return (
    <p id={id} data-testid={id} className="text-sm text-clash" role="alert">
      {message}
    </p>
  );
}

/** A form-level message (errors that belong to no single field). */
export function FormMessage({ message, tone = "error", testId }: { message?: string; tone?: "error" | "success"; testId?: string }) {
  if (!message) return null;
  const colour = tone === "error" ? "border-clash/30 bg-clash/5 text-clash" : "border-tension/30 bg-tension/5 text-tension";
  return (
    <p role={tone === "error" ? "alert" : "status"} data-testid={testId} className={`rounded-md border px-3 py-2 text-sm ${colour}`}>
      {message}
    </p>
  );
}

export function Button({ children, variant = "primary", ...props }: { variant?: "primary" | "quiet" } & React.ButtonHTMLAttributes<HTMLButtonElement>) {
  const look =
    variant === "primary"
      ? "bg-board-800 text-white hover:bg-board-900 disabled:bg-board-700/60"
      : "border border-board-200 bg-white text-board-800 hover:bg-board-100";
  return (
    <button className={`inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed ${look}`} {...props}>
      {children}
    </button>
  );
}

/** Puts the server's answer on the form: each issue beside its field, anything else as the form's message. */
export function showServerError<T extends FieldValues>(form: UseFormReturn<T>, error: unknown): void {
  if (error instanceof ApiError && error.issues.length > 0) {
    for (const issue of error.issues) {
      form.setError((issue.path || "root") as Path<T> | "root", { message: issue.message });
    }
    return;
  }
  form.setError("root", { message: error instanceof Error ? error.message : "Something went wrong. Please try again." });
}
