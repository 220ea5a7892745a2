import type { Metadata } from "next";
import { NameForm } from "@/components/account/name-form";
import { PasswordForm } from "@/components/account/password-form";
import { SessionsForm } from "@/components/account/sessions-form";
import { getUserById } from "@/db/queries/users";
import { requirePageUser } from "@/lib/auth/session";
import { redirect } from "next/navigation";

export const metadata: Metadata = { title: "Account" };

export default async function AccountPage() {
  const sessionUser = await requirePageUser("/account");
  const user = await getUserById({ id: sessionUser.id });
  if (!user) redirect("/sign-in");
  return (
    <div className="flex max-w-xl flex-col gap-6">
      <div>
        <h1 className="text-2xl font-semibold">Account</h1>
        <p className="mt-1 font-mono text-sm text-board-700" data-testid="account-email">
          {user.email}
        </p>
      </div>
      <NameForm name={user.name} />
      <PasswordForm />
      <SessionsForm />
    </div>
  );
}
