// /networks/:id/share — Share: the owner makes links that grant view or edit on this network
// alone (optionally expiring), sees who used each and when, revokes them, and asks someone by
// e-mail to review the network with a fresh link.
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/share";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { CopyLink, ShareLinkList } from "#app/components/review/ShareLinks.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { emailSchema, reviewMessageSchema } from "#app/lib/fieldSchemas.ts";
import { formFields } from "#app/lib/forms.ts";
import { MailUnavailable, mailAvailable, PERSONAL_MAIL_LIMIT_MESSAGE, sendMail, spendPersonalMailAllowance } from "#app/lib/mail.server.ts";
import { reviewRequestMail } from "#app/lib/mailMessages.ts";
import { createShareLink, revokeShareLink, shareLinkById, shareLinksOf } from "#app/lib/shareLinks.server.ts";
import { SHARE_EXPIRY_MAX_DAYS, shareRequestSchema } from "#app/lib/shareRequest.ts";
import { z } from "zod";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Share ${data?.name ?? "network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network } = await requireNetwork(request, params, "share");
  return { id: network.id, name: network.name, mailAvailable: mailAvailable(), links: await shareLinksOf(db, network.id) };
}

/** The form's fields as the API's request: expiry in days, empty for none. */
function shareRequestFrom(form: FormData) {
  const fields = formFields(form);
  const days = fields.expiresInDays?.trim();
  return shareRequestSchema.safeParse({
    role: fields.role,
    expiresInDays: days ? Number(days) : null,
    label: fields.label,
  });
}

const reviewerSchema = z.object({
  email: emailSchema("Enter the reviewer's e-mail address."),
  message: reviewMessageSchema.default(""),
});

type ActionAnswer = { ok: boolean; message: string; url?: string; form: "create" | "review" | "revoke" };

export async function action({ request, params }: Route.ActionArgs) {
  const { db, user, network } = await requireNetwork(request, params, "share");
  const form = await request.formData();
  const intent = form.get("intent");

  if (intent === "revoke") {
    const linkId = parseId(String(form.get("linkId") ?? ""));
    const link = linkId === null ? undefined : await shareLinkById(db, linkId, network.id);
    if (!link) return data<ActionAnswer>({ ok: false, message: "There is no such link on this network.", form: "revoke" }, { status: 404 });
    const revoked = await revokeShareLink(db, link, user);
    return data<ActionAnswer>({ ok: true, message: revoked ? `Link #${link.id} is revoked; it opens nothing from now on.` : `Link #${link.id} was already revoked.`, form: "revoke" });
  }

  if (intent === "create" || intent === "review") {
    const formName = intent;
    const parsed = shareRequestFrom(form);
    if (!parsed.success) return data<ActionAnswer>({ ok: false, message: parsed.error.issues[0].message, form: formName }, { status: 400 });
    if (intent === "create") {
      const { url } = await createShareLink(db, { network, request: parsed.data, by: user });
      return data<ActionAnswer>({ ok: true, message: "Link made.", url, form: formName });
    }
    const reviewer = reviewerSchema.safeParse(formFields(form));
    if (!reviewer.success) return data<ActionAnswer>({ ok: false, message: reviewer.error.issues[0].message, form: formName }, { status: 400 });
    if (!mailAvailable()) return data<ActionAnswer>({ ok: false, message: new MailUnavailable().message, form: formName }, { status: 503 });
    if (!spendPersonalMailAllowance(user.id)) return data<ActionAnswer>({ ok: false, message: PERSONAL_MAIL_LIMIT_MESSAGE, form: formName }, { status: 429 });
    const request_ = { ...parsed.data, label: parsed.data.label || `Review by ${reviewer.data.email}` };
    const { link, url } = await createShareLink(db, { network, request: request_, by: user });
    try {
      await sendMail({
        to: reviewer.data.email,
        ...reviewRequestMail({ networkName: network.name, fromName: user.name, role: link.role, url, expiresAt: link.expires_at, message: reviewer.data.message }),
      });
    } catch {
      await revokeShareLink(db, link, user);
      return data<ActionAnswer>({ ok: false, message: `The message to ${reviewer.data.email} could not be sent, so its link was revoked again. Try later.`, form: formName }, { status: 502 });
    }
    return data<ActionAnswer>({ ok: true, message: `Review request sent to ${reviewer.data.email} with link #${link.id}.`, form: formName });
  }
  return data<ActionAnswer>({ ok: false, message: "Unknown request: the form named no known action.", form: "create" }, { status: 400 });
}

function LinkFields({ idPrefix }: { idPrefix: string }) {
  return (
    <>
      <fieldset>
        <legend className="field-label">The link lets them</legend>
        <label className="mr-4 inline-flex items-center gap-2">
          <input type="radio" name="role" value="viewer" defaultChecked /> read (no account needed)
        </label>
        <label className="inline-flex items-center gap-2">
          <input type="radio" name="role" value="editor" /> edit (they sign in first)
        </label>
      </fieldset>
      <div>
        <label htmlFor={`${idPrefix}-expiry`} className="field-label">
          Expires after (days)
        </label>
        <input
          id={`${idPrefix}-expiry`}
          name="expiresInDays"
          type="number"
          min={1}
          max={SHARE_EXPIRY_MAX_DAYS}
          step={1}
          defaultValue={14}
          className="input w-32"
          aria-describedby={`${idPrefix}-expiry-hint`}
        />
        <p id={`${idPrefix}-expiry-hint`} className="field-hint">
          Leave empty for a link that works until you revoke it.
        </p>
      </div>
    </>
  );
}

export default function SharePage({ loaderData, actionData }: Route.ComponentProps) {
  const { id, name, links, mailAvailable: canMail } = loaderData;
  const busy = useNavigation().state === "submitting";
  const answerFor = (form: ActionAnswer["form"]) => (actionData?.form === form ? actionData : undefined);
  const created = answerFor("create");
  const review = answerFor("review");
  const revoke = answerFor("revoke");
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/networks/${id}`}>← {name}</Link>
      </p>
      <PageTitle title="Share" lead={`Links to "${name}" alone: whoever holds one reads (or edits) this network and nothing else.`} />
      <div className="grid grid-cols-1 items-start gap-6 lg:grid-cols-2">
        <section aria-labelledby="new-link-title" className="panel space-y-4 p-5">
          <h2 id="new-link-title" className="text-lg">
            Make a link
          </h2>
          <Form method="post" className="space-y-4">
            <input type="hidden" name="intent" value="create" />
            <LinkFields idPrefix="new-link" />
            <div>
              <label htmlFor="new-link-label" className="field-label">
                Who it is for (optional)
              </label>
              <input id="new-link-label" name="label" className="input" maxLength={200} />
            </div>
            <button type="submit" className="btn btn-primary" disabled={busy}>
              Make link
            </button>
          </Form>
          {created && !created.ok ? <Notice tone="error">{created.message}</Notice> : null}
          {created?.ok && created.url ? <CopyLink url={created.url} label="The new link" /> : null}
        </section>

        <section aria-labelledby="review-request-title" className="panel space-y-4 p-5">
          <h2 id="review-request-title" className="text-lg">
            Ask for a review
          </h2>
          <p className="text-sm text-ink-soft">Sends "please review this network" with a new link of its own.</p>
          {canMail ? (
            <Form method="post" className="space-y-4">
              <input type="hidden" name="intent" value="review" />
              <div>
                <label htmlFor="review-email" className="field-label">
                  Reviewer's e-mail
                </label>
                <input id="review-email" name="email" type="email" required className="input" autoComplete="off" />
              </div>
              <LinkFields idPrefix="review" />
              <div>
                <label htmlFor="review-message" className="field-label">
                  A note for them (optional)
                </label>
                <textarea id="review-message" name="message" rows={3} maxLength={2000} className="input" />
              </div>
              <button type="submit" className="btn btn-primary" disabled={busy}>
                Send review request
              </button>
            </Form>
          ) : (
            <Notice tone="info">E-mail is not set up on this server; make a link and send it yourself.</Notice>
          )}
          {review ? <Notice tone={review.ok ? "ok" : "error"}>{review.message}</Notice> : null}
        </section>
      </div>

      <section aria-labelledby="links-title" className="panel mt-6 p-5">
        <h2 id="links-title" className="text-lg">
          Links to this network
        </h2>
        {revoke ? (
          <div className="mt-3">
            <Notice tone={revoke.ok ? "ok" : "error"}>{revoke.message}</Notice>
          </div>
        ) : null}
        <ShareLinkList links={links} />
      </section>
    </>
  );
}
