import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { getSessionUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Sign in" };

/** Only same-site paths are accepted as the place to return to after signing in. */
function safeCallback(value: string | string[] | undefined): string {
  const path = Array.isArray(value) ? value[0] : value;
  return path && /^\/(?![/\\])/.test(path) ? path : "/projects";
}

export default async function SignInPage({ searchParams }: PageProps<"/sign-in">) {
  const params = await searchParams;
  const callbackUrl = safeCallback(params.callbackUrl);
  if (await getSessionUser()) redirect(callbackUrl);
  const email = typeof params.email === "string" ? params.email : "";
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-xl font-semibold">Sign in</h1>
      <SignInForm callbackUrl={callbackUrl} defaultEmail={email} />
    </div>
  );
}
