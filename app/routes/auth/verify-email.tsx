// /verify-email?token=… — the link from the confirmation message. Opening it proves the address;
// nothing else changes, and it works once.
import { data, Link } from "react-router";
import type { Route } from "./+types/verify-email";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { verifyEmail } from "#app/lib/emailVerification.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Confirm your address · Kilostep" }, { name: "robots", content: "noindex" }];

export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token");
  const userId = await verifyEmail(await getDb(), token);
  if (userId === null)
    return data({ verified: false, sentence: "This link is unknown, used already or more than a week old. Ask for a new one on your account page." }, { status: 410 });
  return { verified: true, sentence: "Your e-mail address is confirmed. Team owners can now add you to their teams by it." };
}

export default function VerifyEmail({ loaderData }: Route.ComponentProps) {
  return (
    <section aria-labelledby="verify-title" className="panel mx-auto max-w-xl p-6 sm:p-8">
      <PageTitle title={<span id="verify-title">{loaderData.verified ? "Address confirmed" : "This link no longer works"}</span>} />
      <Notice tone={loaderData.verified ? "ok" : "error"}>{loaderData.sentence}</Notice>
      <p className="mt-4">
        <Link to="/account">Your account</Link>
      </p>
    </section>
  );
}
