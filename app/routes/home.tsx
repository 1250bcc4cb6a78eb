import { Link } from "react-router";
import type { Route } from "./+types/home";
import { BrandMark } from "#app/components/BrandMark.tsx";
import { getSessionUser } from "#app/lib/session.server.ts";

export const meta: Route.MetaFunction = () => [{ title: "Kilostep · plan a grid connection" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getSessionUser(request);
  return { signedInAs: user?.name ?? null };
}

const STEPS = [
  { title: "Draw the chain", text: "Source, step-up transformer, line or cable, step-down transformer and loads, on one sheet." },
  { title: "Solve it in per unit", text: "Bus voltages, branch flows, I²R and transformer losses, and fault levels by IEC 60909-0." },
  { title: "Compare voltages", text: "Re-rate the link to 33, 66 or 132 kV and weigh losses over its life against capital cost." },
  { title: "Share for review", text: "Colleagues see or edit by team role; reviewers outside the team get a link." },
];

export default function Home({ loaderData }: Route.ComponentProps) {
  return (
    <div className="space-y-10">
      <section aria-labelledby="home-title" className="panel grid gap-6 p-6 sm:p-10 md:grid-cols-[1fr_auto]">
        <div className="max-w-2xl">
          <h1 id="home-title" className="text-4xl leading-tight">
            How should the power get there?
          </h1>
          <p className="mt-4 text-lg text-ink-soft">
            Kilostep is for the engineers who plan a new grid connection: at which voltage, through which transformers
            and which conductor, and whether the chain still holds its voltage, its thermal limits and its switchgear
            ratings.
          </p>
          <div className="mt-6 flex flex-wrap gap-3">
            {loaderData.signedInAs ? (
              <Link to="/networks" className="btn btn-primary">
                Open your networks
              </Link>
            ) : (
              <>
                <Link to="/sign-up" className="btn btn-primary">
                  Create an account
                </Link>
                <Link to="/sign-in" className="btn">
                  Sign in
                </Link>
              </>
            )}
          </div>
        </div>
        <BrandMark className="hidden h-28 w-28 self-center md:block" />
      </section>
      <section aria-labelledby="how">
        <h2 id="how" className="sr-only">
          What Kilostep does
        </h2>
        <ol className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          {STEPS.map((step, i) => (
            <li key={step.title} className="panel p-5">
              <p className="text-sm font-semibold tracking-wide text-accent">Step {i + 1}</p>
              <h3 className="mt-1 text-lg">{step.title}</h3>
              <p className="mt-2 text-ink-soft">{step.text}</p>
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
