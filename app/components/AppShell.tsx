import type { ReactNode } from "react";
import { Form, Link, NavLink, useMatches } from "react-router";
import { BrandMark } from "./BrandMark.tsx";

export interface ShellUser {
  name: string;
  email: string;
}

const navLinkClass = ({ isActive }: { isActive: boolean }) =>
  [
    "rounded px-3 py-2 font-medium no-underline transition-colors",
    isActive ? "bg-accent-wash text-accent-strong" : "text-ink-soft hover:bg-paper hover:text-ink",
  ].join(" ");

/** A route whose `handle` says `fullWindow` (the sheet) gets the window under a slim header. */
export interface FullWindowHandle {
  fullWindow?: boolean;
}

function useFullWindow(): boolean {
  return useMatches().some((match) => (match.handle as FullWindowHandle | undefined)?.fullWindow === true);
}

/** Every page's frame: the header with the product name and navigation, the page, the caution. */
export function AppShell({ user, children }: { user: ShellUser | null; children: ReactNode }) {
  const fullWindow = useFullWindow();
  return (
    <div className={fullWindow ? "app-full-window flex min-h-dvh flex-col md:h-dvh" : "flex min-h-screen flex-col"}>
      <a
        href="#main"
        className="sr-only rounded bg-paper-sheet px-3 py-2 focus:not-sr-only focus:absolute focus:left-3 focus:top-3 focus:z-50"
      >
        Skip to the page
      </a>
      <header className="border-b border-paper-edge bg-paper-sheet/95">
        <div
          className={
            fullWindow
              ? "flex items-center gap-x-4 px-3 py-0.5"
              : "mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3 sm:px-6"
          }
        >
          <Link to="/" className="flex items-center gap-2.5 text-ink no-underline hover:text-ink">
            <BrandMark className={fullWindow ? "h-6 w-6" : "h-8 w-8"} />
            <span className={fullWindow ? "sr-only text-lg font-semibold tracking-wide sm:not-sr-only" : "text-xl font-semibold tracking-wide"}>
              Kilostep
            </span>
          </Link>
          <nav
            aria-label="Main"
            className={fullWindow ? "flex min-w-0 flex-1 items-center gap-1" : "flex w-full flex-wrap items-center gap-1 sm:w-auto sm:flex-1"}
          >
            {user ? (
              <>
                <NavLink to="/networks" className={navLinkClass}>
                  Networks
                </NavLink>
                <NavLink to="/teams" className={navLinkClass}>
                  Teams
                </NavLink>
                <span className="flex-1" />
                <NavLink to="/account" className={navLinkClass}>
                  <span className="sm:hidden">Account</span>
                  <span className="hidden sm:inline">
                    <span className="sr-only">Account: </span>
                    {user.name}
                  </span>
                </NavLink>
                <Form method="post" action="/sign-out">
                  <button type="submit" className="btn btn-small ml-1">
                    Sign out
                  </button>
                </Form>
              </>
            ) : (
              <>
                <span className="flex-1" />
                <NavLink to="/sign-in" className={navLinkClass}>
                  Sign in
                </NavLink>
                <Link to="/sign-up" className="btn btn-primary btn-small ml-1">
                  Create an account
                </Link>
              </>
            )}
          </nav>
        </div>
      </header>
      <main
        id="main"
        tabIndex={-1}
        className={
          fullWindow
            ? "flex w-full flex-1 flex-col focus:outline-none md:min-h-0"
            : "mx-auto w-full max-w-6xl flex-1 px-4 py-8 focus:outline-none sm:px-6"
        }
      >
        {children}
      </main>
      {/* The sheet carries the caution with its results (ResultsTabs). */}
      <footer className={fullWindow ? "sr-only" : "border-t border-paper-edge bg-paper-sheet/95"}>
        <p className="mx-auto max-w-6xl px-4 py-4 text-sm text-ink-muted sm:px-6">
          <strong className="font-semibold text-ink-soft">Caution:</strong> results are for planning-stage screening.
          Verify them against the applicable grid code, local regulations and the equipment makers' data; protection
          settings and construction designs must be done and approved by licensed engineers. Fault levels by IEC
          60909-0 are not a protection study.
        </p>
      </footer>
    </div>
  );
}
