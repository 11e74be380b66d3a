import type { Metadata } from "next";
import Link from "next/link";
import { AcceptAsMemberForm, AcceptNewAccountForm } from "@/components/team/accept-forms";
import { RoleBadge } from "@/components/ui/role-badge";
import { getSessionUser } from "@/server/context";
import { checkInvitation } from "@/server/team/invitations";
import { acceptAsMemberAction, acceptAsNewAccountAction } from "./actions";

export const metadata: Metadata = { title: "Invitation" };

function Card({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="mx-auto max-w-md px-5 py-12">
      <section className="rounded-[var(--radius-card)] border border-line bg-paper-raised p-6 shadow-sm">
        <h1 className="text-2xl font-semibold tracking-tight text-tide-900">{title}</h1>
        <div className="mt-4 space-y-4 text-sm text-ink-soft">{children}</div>
      </section>
    </div>
  );
}

/** The page an invitation mail links to; reading it changes nothing, only the forms accept. */
export default async function InvitePage({ searchParams }: { searchParams: Promise<{ token?: string | string[] }> }) {
  const raw = (await searchParams).token;
  const token = typeof raw === "string" ? raw : "";
  if (token.length < 20 || token.length > 200)
    return (
      <Card title="Invitation link incomplete">
        <p role="alert">This invitation link is incomplete. Copy the whole link from the mail, or ask the admin to resend it.</p>
      </Card>
    );
  const [check, user] = await Promise.all([checkInvitation({ token }), getSessionUser()]);
  if (!check.ok)
    return (
      <Card title="This invitation cannot be used">
        <p role="alert" data-reason={check.reason}>
          {check.message}
        </p>
        <p>
          <Link href="/sign-in" className="font-semibold text-tide-700 underline">
            Sign in
          </Link>
        </p>
      </Card>
    );
  const { invitation, workspaceName } = check;
  const intro = (
    <p>
      You are invited to <strong className="text-ink">{workspaceName}</strong> as <RoleBadge role={invitation.role} />.
    </p>
  );
  if (user && user.email === invitation.email)
    return (
      <Card title={`Join ${workspaceName}`}>
        {intro}
        <AcceptAsMemberForm token={token} label={`Join as ${invitation.role}`} action={acceptAsMemberAction} />
      </Card>
    );
  if (user)
    return (
      <Card title="Signed in as someone else">
        {intro}
        <p role="alert">
          This invitation is for {invitation.email}, but you are signed in as {user.email}. Sign out, then open the link again.
        </p>
      </Card>
    );
  if (check.hasAccount)
    return (
      <Card title={`Join ${workspaceName}`}>
        {intro}
        <p>{invitation.email} already has an account. Sign in with it to accept.</p>
        <Link href={`/sign-in?callbackUrl=${encodeURIComponent(`/invite?token=${token}`)}`} className="inline-flex rounded-md bg-tide-700 px-3.5 py-2 font-semibold text-paper-raised hover:bg-tide-800">
          Sign in to accept
        </Link>
      </Card>
    );
  return (
    <Card title={`Join ${workspaceName}`}>
      {intro}
      <AcceptNewAccountForm token={token} email={invitation.email} action={acceptAsNewAccountAction} />
    </Card>
  );
}
