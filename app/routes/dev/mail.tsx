// /dev/mail — the local mail fake's inbox, for people trying the app on their own machine: every
// message Kilostep sent (invitations, password resets, review requests, note alerts), with its
// links. Only for a client on this machine while the fake runs, never in production (404).
import { data } from "react-router";
import type { Route } from "./+types/mail";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { formatDateTime } from "#app/lib/format.ts";
import { mayOpenDevPages } from "#app/lib/devPages.server.ts";
import { receivedMail } from "#app/lib/mail.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Mail fake · Kilostep" }, { name: "robots", content: "noindex" }];

export async function loader({ context }: Route.LoaderArgs) {
  if (!mayOpenDevPages(context)) throw data("There is nothing at this address.", { status: 404 });
  const messages = await receivedMail();
  return { messages: messages.map(({ id, receivedAt, from, to, subject, text, links }) => ({ id, receivedAt, from, to, subject, text, links })) };
}

/** A link's path, shortened; a message may carry text that only looks like an address. */
function linkWords(link: string): string {
  const path = URL.canParse(link) ? new URL(link).pathname : link;
  return path.length > 40 ? `${path.slice(0, 40)}…` : path;
}

export default function DevMail({ loaderData }: Route.ComponentProps) {
  const { messages } = loaderData;
  return (
    <>
      <PageTitle
        title="Mail fake"
        lead="Every message this server sent, kept here instead of being delivered. Only development and test servers have this page."
      />
      {messages.length === 0 ? (
        <p className="text-ink-soft">No messages yet. Invite someone to a team, ask for a password reset or send a review request.</p>
      ) : (
        <ol className="space-y-4" aria-label="Messages, newest first">
          {messages.map((m) => (
            <li key={m.id} className="panel p-5">
              <article aria-labelledby={`mail-${m.id}`}>
                <h2 id={`mail-${m.id}`} className="text-lg">
                  {m.subject || "(no subject)"}
                </h2>
                <dl className="mt-2 grid grid-cols-[5rem_1fr] gap-x-3 gap-y-1 text-sm">
                  <dt className="text-ink-muted">To</dt>
                  <dd>{m.to.join(", ")}</dd>
                  <dt className="text-ink-muted">From</dt>
                  <dd>{m.from}</dd>
                  <dt className="text-ink-muted">Received</dt>
                  <dd>{formatDateTime(m.receivedAt)}</dd>
                </dl>
                <pre className="mt-3 whitespace-pre-wrap break-words rounded border border-paper-rule bg-paper p-3 font-sans text-sm">{m.text}</pre>
                {m.links.length > 0 ? (
                  <p className="mt-2 text-sm">
                    Links:{" "}
                    {m.links.map((link, i) => (
                      <span key={i}>
                        {i > 0 ? " · " : ""}
                        <a href={link}>{linkWords(link)}</a>
                      </span>
                    ))}
                  </p>
                ) : null}
              </article>
            </li>
          ))}
        </ol>
      )}
    </>
  );
}
