import type { Metadata } from "next";
import Link from "next/link";
import { AcceptInvitationButton, JoinForm } from "@/components/auth/join-form";
import { FormMessage } from "@/components/ui/form";
import { getInvitationByTokenHash } from "@/db/queries/invitations";
import { getSessionUser } from "@/lib/auth/session";
import { tokenParamsSchema } from "@/lib/http/params";
import { ROLE_LABELS } from "@/lib/permissions";
import { hashToken, INVITATION_EXPIRED, INVITATION_USED, invitationCheck } from "@/lib/team/invitation-link";

export const metadata: Metadata = { title: "Join a project" };

export default async function JoinPage({ params }: PageProps<"/join/[token]">) {
  const parsed = tokenParamsSchema.safeParse(await params);
  const invitation = parsed.success ? invitationCheck(await getInvitationByTokenHash({ tokenHash: hashToken(parsed.data.token) })) : null;
  if (!parsed.success || !invitation) {
    return <Notice title="This link does not work" message="This invitation link is not valid. Check that you copied it whole, or ask the project owner for a new one." />;
  }
  if (invitation.status === "accepted") return <Notice title="Invitation already used" message={INVITATION_USED} signIn />;
  if (invitation.status === "expired") return <Notice title="Invitation expired" message={INVITATION_EXPIRED} />;

  const token = parsed.data.token;
  const user = await getSessionUser();
  const joinPath = `/join/${token}`;
  return (
    <div className="flex flex-col gap-4" data-testid="join-page">
      <div>
        <h1 className="text-xl font-semibold">Join {invitation.project.name}</h1>
        <p className="mt-1 text-sm text-board-700">
          You are invited as <strong>{ROLE_LABELS[invitation.role]}</strong> with <span className="font-mono">{invitation.email}</span>.
        </p>
      </div>
      {user && user.email !== invitation.email ? (
        <FormMessage message={`You are signed in as ${user.email}, but this invitation is for ${invitation.email}. Sign out, then open the link again.`} />
      ) : user ? (
        <AcceptInvitationButton token={token} projectId={invitation.project.id} />
      ) : invitation.accountExists ? (
        <>
          <p className="text-sm">An account with this e-mail already exists. Sign in to accept the invitation.</p>
          <Link
            href={`/sign-in?callbackUrl=${encodeURIComponent(joinPath)}&email=${encodeURIComponent(invitation.email)}`}
            className="rounded-md bg-board-800 px-4 py-2 text-center text-sm font-medium text-white"
            data-testid="join-sign-in"
          >
            Sign in to accept
          </Link>
        </>
      ) : (
        <JoinForm token={token} email={invitation.email} projectId={invitation.project.id} />
      )}
    </div>
  );
}

function Notice({ title, message, signIn = false }: { title: string; message: string; signIn?: boolean }) {
  return (
    <div className="flex flex-col gap-3" data-testid="join-notice">
      <h1 className="text-xl font-semibold">{title}</h1>
      <FormMessage message={message} />
      {signIn ? (
        <Link href="/sign-in" className="text-sm text-tension underline underline-offset-4">
          Go to sign-in
        </Link>
      ) : null}
    </div>
  );
}
