// Every migration, in order, by static import: Vite, tsx and vitest all bundle or load them alike
// (a folder scan would miss files the bundler never saw). Add a new file here when you add one.
import type { Migration, MigrationProvider } from "kysely";
import * as accountsAndTeams from "./2026-12-01-01-accounts-and-teams.ts";
import * as networks from "./2026-12-01-02-networks.ts";
import * as ladderStudies from "./2026-12-09-01-ladder-studies.ts";
import * as libraryTypesAndApiTokens from "./2026-12-10-01-library-types-and-api-tokens.ts";
import * as sharingAndReview from "./2026-12-11-01-sharing-and-review.ts";
import * as verifiedAddresses from "./2026-12-12-01-verified-addresses.ts";
import * as guestReviewNotes from "./2026-12-13-01-guest-review-notes.ts";
import * as draftsAndEditingSessions from "./2026-12-13-02-drafts-and-editing-sessions.ts";
import * as ladderConductorSizing from "./2026-12-14-01-ladder-conductor-sizing.ts";

export const migrations: Record<string, Migration> = {
  "2026-12-01-01-accounts-and-teams": accountsAndTeams,
  "2026-12-01-02-networks": networks,
  "2026-12-09-01-ladder-studies": ladderStudies,
  "2026-12-10-01-library-types-and-api-tokens": libraryTypesAndApiTokens,
  "2026-12-11-01-sharing-and-review": sharingAndReview,
  "2026-12-12-01-verified-addresses": verifiedAddresses,
  "2026-12-13-01-guest-review-notes": guestReviewNotes,
  "2026-12-13-02-drafts-and-editing-sessions": draftsAndEditingSessions,
  "2026-12-14-01-ladder-conductor-sizing": ladderConductorSizing,
};

export const migrationProvider: MigrationProvider = {
  getMigrations: async () => migrations,
};
