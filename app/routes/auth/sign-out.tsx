import { redirect } from "react-router";
import type { Route } from "./+types/sign-out";
import { guardPageRequest } from "#app/lib/requestGuards.server.ts";
import { endSession } from "#app/lib/session.server.ts";

/** Signing out is a POST (a link could be followed by a prefetcher); it deletes the session row. */
export async function action({ request }: Route.ActionArgs) {
  guardPageRequest(request);
  return redirect("/", { headers: { "Set-Cookie": await endSession(request) } });
}

export async function loader() {
  return redirect("/");
}
