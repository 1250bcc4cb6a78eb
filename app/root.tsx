import { isRouteErrorResponse, Links, Meta, Outlet, Scripts, ScrollRestoration, useRouteLoaderData } from "react-router";
import type { Route } from "./+types/root";
import { AppShell } from "./components/AppShell.tsx";
import { PageTitle } from "./components/PageTitle.tsx";
import { getSessionUser } from "./lib/session.server.ts";
import "./app.css";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getSessionUser(request);
  return { user: user ? { name: user.name, email: user.email } : null };
}

export const meta: Route.MetaFunction = () => [
  { title: "Kilostep" },
  { name: "description", content: "Plan a radial grid connection: draw it, solve it, compare voltages, share it." },
];

/**
 * The page's CSP nonce, for the elements React Router renders here. On the server each component
 * takes it from ServerRouter (entry.server.tsx), so the prop stays unset. The client bundle never
 * carries it: the client reads it back from a script the server wrote. Browsers blank the nonce
 * attribute once the page is parsed but keep the `nonce` property, and the property is what React
 * compares when it hydrates; rendering no nonce there would be a mismatch on every page.
 */
const hydratedNonce = typeof document === "undefined" ? undefined : document.querySelector<HTMLScriptElement>("script[nonce]")?.nonce;

export function Layout({ children }: { children: React.ReactNode }) {
  const data = useRouteLoaderData<typeof loader>("root");
  return (
    <html lang="en-GB">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <link rel="icon" href="/favicon.svg" type="image/svg+xml" />
        <Meta />
        <Links nonce={hydratedNonce} />
      </head>
      <body className="font-sans antialiased">
        <AppShell user={data?.user ?? null}>{children}</AppShell>
        <ScrollRestoration nonce={hydratedNonce} />
        <Scripts nonce={hydratedNonce} />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

/** Failures in our words: what happened and what to do next, never a stack trace in production. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  let title = "Something went wrong";
  let detail = "Kilostep could not finish this request. Try again; if it keeps happening, tell your team's owner.";
  if (isRouteErrorResponse(error)) {
    // Our own refusals carry a sentence; the router's own 404 text ("Error: No route matches…") is not for people.
    const sentence = typeof error.data === "string" && error.data && !error.data.startsWith("Error:") ? error.data : undefined;
    if (error.status === 404) {
      title = "Not found";
      detail = sentence ?? "There is nothing at this address, or it is not yours to see.";
    } else if (error.status === 403) {
      title = "Not allowed";
      detail = sentence ?? "Your role does not allow this.";
    } else if (error.status === 409) {
      title = "Changed in the meantime";
      detail = sentence ?? "Someone else changed this first. Reload and try again.";
    } else {
      title = `Error ${error.status}`;
      detail = sentence ?? error.statusText ?? detail;
    }
  } else if (import.meta.env.DEV && error instanceof Error) {
    detail = error.message;
  }
  return (
    <section aria-labelledby="error-title" className="panel max-w-2xl p-6">
      <PageTitle title={<span id="error-title">{title}</span>} />
      <p className="text-ink-soft">{detail}</p>
      <p className="mt-4">
        <a href="/networks">Back to your networks</a>
      </p>
    </section>
  );
}
