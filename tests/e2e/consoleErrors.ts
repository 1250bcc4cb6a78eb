// A browser test fails on any console error or uncaught error of the page: call the returned
// function at the end of the test.
import { expect, type Page } from "@playwright/test";

export function failOnConsoleErrors(page: Page) {
  const errors: string[] = [];
  page.on("console", (message) => {
    if (message.type() === "error") errors.push(message.text());
  });
  page.on("pageerror", (error) => errors.push(error.message));
  return () => expect(errors, "console errors on the page").toEqual([]);
}
