// The HTML render's time limit: a page cut off by it is never answered 500 on that account. A form
// post whose action has done its work is sent to see the page again (303, Post/Redirect/Get), so
// a saved change is not reported as a failure; a page asked for keeps its status with what was
// ready. A page that really fails still answers 500. The render that never finishes is a component
// that suspends forever, so the cut-off always happens (the limit is short only to keep the test quick).
import { createElement as h, Suspense, type ReactNode } from "react";
import { describe, expect, it } from "vitest";
import { renderDocument } from "#app/entry.server.tsx";

function Never(): never {
  throw new Promise(() => {});
}

function Broken(): never {
  throw new Error("the page's own failure");
}

const page = (inner: ReactNode) => h("html", { lang: "en" }, h("body", null, h("p", null, "Shell"), h(Suspense, { fallback: h("p", null, "Waiting") }, inner)));

const request = (method: string) => new Request("http://kilostep.test/networks/7/loads-import?step=2", { method, ...(method === "POST" ? { body: "a=1" } : {}) });

describe.each([true, false])("a render cut off by its time limit (everything at once: %s)", (allReady) => {
  it("answers a successful form post with 303 to the same address, not 500", async () => {
    const response = await renderDocument(request("POST"), 200, new Headers(), page(h(Never)), { allReady, timeoutMs: 30 });
    if (allReady) {
      expect(response.status).toBe(303);
      expect(response.headers.get("Location")).toBe("/networks/7/loads-import?step=2");
    } else {
      // Streaming: the shell went out before the cut-off, with the action's status.
      expect(response.status).toBe(200);
      expect(await response.text()).toContain("Shell");
    }
  });

  it("keeps a page's own status and sends what was ready", async () => {
    // React itself logs a note when a whole-page render is aborted with work left; it is not ours to fail on.
    const log = console.error;
    console.error = () => {};
    const response = await renderDocument(request("GET"), 200, new Headers(), page(h(Never)), { allReady, timeoutMs: 30 }).finally(() => {
      console.error = log;
    });
    expect(response.status).toBe(200);
    const html = await response.text();
    expect(html).toContain("Shell");
    expect(html).toContain("Waiting");
  });
});

describe("a render cut off before its shell was ready", () => {
  it("sends a successful form post to see the page again", async () => {
    const response = await renderDocument(request("POST"), 200, new Headers(), h(Never), { allReady: false, timeoutMs: 30 });
    expect(response.status).toBe(303);
  });
});

describe("a page that fails in its own right", () => {
  it("still answers 500", async () => {
    const errors: unknown[] = [];
    const log = console.error;
    console.error = (error: unknown) => void errors.push(error);
    try {
      const response = await renderDocument(request("GET"), 200, new Headers(), page(h(Broken)), { allReady: true, timeoutMs: 5_000 });
      expect(response.status).toBe(500);
    } finally {
      console.error = log;
    }
  });
});
