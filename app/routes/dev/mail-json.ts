// /dev/mail.json — what the local mail fake received, newest first, for tests (?to= narrows it to
// one recipient). Only for a client on this machine while the fake runs, never in production (404).
import type { Route } from "./+types/mail-json";
import { mayOpenDevPages } from "#app/lib/devPages.server.ts";
import { receivedMail } from "#app/lib/mail.server.ts";

export async function loader({ request, context }: Route.LoaderArgs) {
  if (!mayOpenDevPages(context)) return Response.json({ error: "There is nothing at this address." }, { status: 404 });
  const to = new URL(request.url).searchParams.get("to") ?? undefined;
  return Response.json({ messages: await receivedMail({ to }) }, { headers: { "Cache-Control": "no-store" } });
}
