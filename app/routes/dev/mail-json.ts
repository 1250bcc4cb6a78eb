// /dev/mail.json — what the local mail fake received, newest first, for tests (?to= narrows it to
// one recipient). Only where the fake runs: in production it does not exist (404).
import type { Route } from "./+types/mail-json";
import { mailFakeRunning, receivedMail } from "#app/lib/mail.server.ts";

export async function loader({ request }: Route.LoaderArgs) {
  if (!mailFakeRunning()) return Response.json({ error: "There is nothing at this address." }, { status: 404 });
  const to = new URL(request.url).searchParams.get("to") ?? undefined;
  return Response.json({ messages: await receivedMail({ to }) }, { headers: { "Cache-Control": "no-store" } });
}
