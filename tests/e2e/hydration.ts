// Waiting for React to have hydrated a page, without a sleep: React reports each commit to the
// developer-tools hook when one is installed before its scripts run, so the test installs a tiny
// one that counts commits. A full page load starts the count again at zero.
import type { Page } from "@playwright/test";

declare global {
  interface Window {
    __kilostepCommits?: number;
    /** A test's own look at the page after each commit (see the sheet's one-render-per-edit test). */
    __kilostepOnCommit?: () => void;
  }
}

/** Call once per page, before the first navigation. */
export async function countReactCommits(page: Page) {
  await page.addInitScript(() => {
    Object.defineProperty(window, "__REACT_DEVTOOLS_GLOBAL_HOOK__", {
      value: {
        supportsFiber: true,
        inject: () => 1,
        checkDCE: () => {},
        onCommitFiberRoot: () => {
          window.__kilostepCommits = (window.__kilostepCommits ?? 0) + 1;
          window.__kilostepOnCommit?.();
        },
        onCommitFiberUnmount: () => {},
        onPostCommitFiberRoot: () => {},
      },
    });
  });
}

/** Resolves once the page now loaded has been hydrated (its first commit is done). */
export async function hydrated(page: Page) {
  await page.waitForFunction(() => (window.__kilostepCommits ?? 0) > 0);
}
