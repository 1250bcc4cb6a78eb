// On the team page, for owners: invite someone by e-mail with a role, and the invitations still
// waiting to be accepted (each can be withdrawn).
import { useEffect, useRef } from "react";
import { useFetcher } from "react-router";
import { Notice } from "#app/components/Notice.tsx";
import { formatDateTime } from "#app/lib/format.ts";

export interface PendingInvitationItem {
  id: number;
  email: string;
  role: "owner" | "editor" | "viewer";
  invitedByName: string | null;
  createdAt: string;
  expiresAt: string;
}

type Answer = { ok: boolean; message: string; fieldErrors?: Record<string, string> };

function WithdrawButton({ teamId, invitation }: { teamId: number; invitation: PendingInvitationItem }) {
  const fetcher = useFetcher<Answer>();
  return (
    <fetcher.Form method="post" action={`/teams/${teamId}/invitations`}>
      <input type="hidden" name="intent" value="revoke" />
      <input type="hidden" name="invitationId" value={invitation.id} />
      <button type="submit" className="btn btn-small" disabled={fetcher.state !== "idle"} aria-label={`Withdraw the invitation to ${invitation.email}`}>
        Withdraw
      </button>
    </fetcher.Form>
  );
}

export function TeamInvitations({ teamId, invitations }: { teamId: number; invitations: PendingInvitationItem[] }) {
  const fetcher = useFetcher<Answer>();
  const formRef = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (fetcher.state === "idle" && fetcher.data?.ok) formRef.current?.reset();
  }, [fetcher.state, fetcher.data]);
  const emailError = fetcher.data?.fieldErrors?.email;
  return (
    <section aria-labelledby="invite-title" className="panel mt-6 p-5">
      <h2 id="invite-title" className="text-lg">
        Invite by e-mail
      </h2>
      <p className="mt-1 text-sm text-ink-muted">
        They get a link that works once, for a week; it lets them create an account if they have none.
      </p>
      <fetcher.Form method="post" action={`/teams/${teamId}/invitations`} className="mt-4 flex flex-wrap items-end gap-3" ref={formRef} noValidate>
        <input type="hidden" name="intent" value="invite" />
        <div className="min-w-[16rem] flex-1">
          <label htmlFor="invite-email" className="field-label">
            E-mail
          </label>
          <input
            id="invite-email"
            name="email"
            type="email"
            required
            className="input"
            autoComplete="off"
            aria-invalid={emailError ? true : undefined}
            aria-describedby={emailError ? "invite-email-error" : undefined}
          />
          {emailError ? (
            <p id="invite-email-error" className="field-error">
              {emailError}
            </p>
          ) : null}
        </div>
        <div>
          <label htmlFor="invite-role" className="field-label">
            Role
          </label>
          <select id="invite-role" name="role" defaultValue="viewer" className="input">
            <option value="owner">owner</option>
            <option value="editor">editor</option>
            <option value="viewer">viewer</option>
          </select>
        </div>
        <button type="submit" className="btn btn-primary" disabled={fetcher.state !== "idle"}>
          Send invitation
        </button>
      </fetcher.Form>
      {fetcher.data && !emailError ? (
        <div className="mt-3">
          <Notice tone={fetcher.data.ok ? "ok" : "error"}>{fetcher.data.message}</Notice>
        </div>
      ) : null}
      {invitations.length > 0 ? (
        <>
          <h3 className="mt-5 text-base font-semibold">Waiting to be accepted</h3>
          <ul className="mt-2 divide-y divide-paper-rule">
            {invitations.map((invitation) => (
              <li key={invitation.id} className="flex flex-wrap items-center justify-between gap-3 py-2">
                <span>
                  {invitation.email} <span className="role-badge">{invitation.role}</span>
                  <span className="block text-sm text-ink-muted">
                    Sent {formatDateTime(invitation.createdAt)}
                    {invitation.invitedByName ? ` by ${invitation.invitedByName}` : ""} · works until {formatDateTime(invitation.expiresAt)}
                  </span>
                </span>
                <WithdrawButton teamId={teamId} invitation={invitation} />
              </li>
            ))}
          </ul>
        </>
      ) : null}
    </section>
  );
}
