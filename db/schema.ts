// The database as Kysely sees it. Column names are snake_case as stored; timestamps are ISO 8601
// text in UTC (they sort as text), booleans do not occur.
import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";

export type TeamRole = "owner" | "editor" | "viewer";

/** ISO 8601 UTC text, e.g. 2026-12-01T19:21:15.000Z. */
type Timestamp = string;

export interface UsersTable {
  id: Generated<number>;
  /** Stored lower-cased and trimmed, so that one address is one account. */
  email: string;
  name: string;
  password_hash: string;
  created_at: Timestamp;
  /** When a link mailed to the address was opened; null until then. */
  email_verified_at: Timestamp | null;
}

export interface SessionsTable {
  /** Random, unguessable; the cookie carries it signed. */
  id: string;
  user_id: number;
  created_at: Timestamp;
  expires_at: Timestamp;
}

export interface SignInFailuresTable {
  id: Generated<number>;
  /** The e-mail as typed (lower-cased), whether or not such an account exists. */
  account: string;
  /** The client address when the server knows it, else null. */
  address: string | null;
  failed_at: Timestamp;
}

export interface TeamsTable {
  id: Generated<number>;
  name: string;
  created_at: Timestamp;
}

export interface MembershipsTable {
  team_id: number;
  user_id: number;
  role: TeamRole;
  created_at: Timestamp;
}

export interface NetworksTable {
  id: Generated<number>;
  team_id: number;
  name: string;
  current_revision: number;
  created_at: Timestamp;
  updated_at: Timestamp;
  updated_by: number | null;
  deleted_at: Timestamp | null;
  deleted_by: number | null;
}

export interface NetworkRevisionsTable {
  id: Generated<number>;
  network_id: number;
  number: number;
  /** The validated network file as JSON text. */
  document: string;
  author_id: number | null;
  created_at: Timestamp;
  message: ColumnType<string, string | undefined, string>;
  /** A draft's problems as JSON text ([{ path, message }]); null for a complete network. */
  problems: string | null;
  /** Autosaves of one editing session folded into this revision after its first save. */
  folded_saves: ColumnType<number, number | undefined, number>;
  /** When a folded save last changed the revision; null if none did. */
  updated_at: Timestamp | null;
  issued_at: Timestamp | null;
  issued_by: number | null;
  /** 1 when the revision only moved things on the sheet (no engineering change). */
  layout_only: ColumnType<number, number | undefined, number>;
}

export interface LadderStudiesTable {
  /** One saved voltage ladder study per network. */
  network_id: number;
  section_bus: string;
  /** JSON: the candidate voltages in kV, in the order asked. */
  voltages_kv: string;
  /** JSON: per-alternative overrides in the order of voltages_kv (null for none). */
  overrides: string;
  /** JSON: the money inputs with their defaults filled in. */
  money: string;
  /** JSON: the conductor sizing asked for ({ clearingTimeS }), null when the ladder keeps the drawn conductor. */
  sizing: string | null;
  /** The network revision the study was saved against. */
  network_revision: number;
  updated_by: number | null;
  updated_at: Timestamp;
}

export type LibraryTypeKind = "transformer" | "conductor";

export interface LibraryTypesTable {
  id: Generated<number>;
  team_id: number;
  kind: LibraryTypeKind;
  /** Unique within the team and kind, whatever its case. */
  name: string;
  /** The type's numbers as JSON text, checked by app/lib/libraryTypes.ts before storing. */
  data: string;
  created_by: number | null;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export type ApiTokenScope = "read" | "write";

export interface ApiTokensTable {
  id: Generated<number>;
  user_id: number;
  name: string;
  scope: ApiTokenScope;
  /** SHA-256 of the token, hex; the token itself is never stored. */
  token_hash: string;
  created_at: Timestamp;
  last_used_at: Timestamp | null;
  revoked_at: Timestamp | null;
}

export type ShareRole = "viewer" | "editor";

export interface ShareLinksTable {
  id: Generated<number>;
  network_id: number;
  role: ShareRole;
  /** SHA-256 of the link's token, hex; the token itself is shown once and never stored. */
  token_hash: string;
  /** The owner's own words for whom the link is for. */
  label: ColumnType<string, string | undefined, string>;
  created_by: number | null;
  created_at: Timestamp;
  expires_at: Timestamp | null;
  revoked_at: Timestamp | null;
  revoked_by: number | null;
}

export interface ShareLinkUsesTable {
  id: Generated<number>;
  share_link_id: number;
  /** Null when someone without an account opened a view link. */
  user_id: number | null;
  used_at: Timestamp;
}

export interface NetworkGrantsTable {
  /** A grant lives only as long as its link: revoking or expiry ends it at once. */
  share_link_id: number;
  user_id: number;
  network_id: number;
  role: ShareRole;
  created_at: Timestamp;
}

export interface TeamInvitationsTable {
  id: Generated<number>;
  team_id: number;
  /** Lower-cased and trimmed, like users.email. */
  email: string;
  role: TeamRole;
  token_hash: string;
  invited_by: number | null;
  created_at: Timestamp;
  expires_at: Timestamp;
  accepted_at: Timestamp | null;
  accepted_by: number | null;
  revoked_at: Timestamp | null;
}

export interface PasswordResetsTable {
  id: Generated<number>;
  user_id: number;
  token_hash: string;
  created_at: Timestamp;
  expires_at: Timestamp;
  used_at: Timestamp | null;
}

export interface EmailVerificationsTable {
  id: Generated<number>;
  user_id: number;
  /** The address the link was sent to: a later change of address voids the link. */
  email: string;
  token_hash: string;
  created_at: Timestamp;
  expires_at: Timestamp;
  used_at: Timestamp | null;
}

export interface ReviewThreadsTable {
  id: Generated<number>;
  network_id: number;
  /** The element the thread is pinned to; null for the sheet as a whole. */
  element_id: string | null;
  /** The element's name when the thread began, for when it is later removed. */
  element_name: string | null;
  /** The network revision the first note was written against. */
  revision: number;
  created_by: number | null;
  created_at: Timestamp;
  resolved_at: Timestamp | null;
  resolved_by: number | null;
}

export interface ReviewNotesTable {
  id: Generated<number>;
  thread_id: number;
  author_id: number | null;
  /** The name a view-link holder without an account gave; null for an account's note. */
  guest_name: string | null;
  /** The view link a guest's note came through. */
  share_link_id: number | null;
  body: string;
  created_at: Timestamp;
}

export type ReviewNoteMail = "each" | "off";

export interface UserSettingsTable {
  user_id: number;
  /** Owners hear of new review notes on their team's networks: "each" note, or "off". */
  review_note_mail: ColumnType<ReviewNoteMail, ReviewNoteMail | undefined, ReviewNoteMail>;
}

export interface AuditEventsTable {
  id: Generated<number>;
  team_id: number;
  kind: string;
  /** Null for someone without an account (a view-link holder) or a removed account. */
  actor_id: number | null;
  network_id: number | null;
  /** A sentence written when it happened, so later renames do not rewrite history. */
  summary: string;
  created_at: Timestamp;
}

export interface Database {
  users: UsersTable;
  sessions: SessionsTable;
  sign_in_failures: SignInFailuresTable;
  teams: TeamsTable;
  memberships: MembershipsTable;
  networks: NetworksTable;
  network_revisions: NetworkRevisionsTable;
  ladder_studies: LadderStudiesTable;
  library_types: LibraryTypesTable;
  api_tokens: ApiTokensTable;
  share_links: ShareLinksTable;
  share_link_uses: ShareLinkUsesTable;
  network_grants: NetworkGrantsTable;
  team_invitations: TeamInvitationsTable;
  password_resets: PasswordResetsTable;
  email_verifications: EmailVerificationsTable;
  review_threads: ReviewThreadsTable;
  review_notes: ReviewNotesTable;
  user_settings: UserSettingsTable;
  audit_events: AuditEventsTable;
}

export type User = Selectable<UsersTable>;
export type NewUser = Insertable<UsersTable>;
export type UserUpdate = Updateable<UsersTable>;
export type Session = Selectable<SessionsTable>;
export type NewSession = Insertable<SessionsTable>;
export type Team = Selectable<TeamsTable>;
export type NewTeam = Insertable<TeamsTable>;
export type TeamUpdate = Updateable<TeamsTable>;
export type Membership = Selectable<MembershipsTable>;
export type NewMembership = Insertable<MembershipsTable>;
export type MembershipUpdate = Updateable<MembershipsTable>;
export type NetworkRow = Selectable<NetworksTable>;
export type NewNetworkRow = Insertable<NetworksTable>;
export type NetworkUpdate = Updateable<NetworksTable>;
export type NetworkRevision = Selectable<NetworkRevisionsTable>;
export type NewNetworkRevision = Insertable<NetworkRevisionsTable>;
export type LadderStudyRow = Selectable<LadderStudiesTable>;
export type LibraryTypeRow = Selectable<LibraryTypesTable>;
export type ApiTokenRow = Selectable<ApiTokensTable>;
export type ShareLinkRow = Selectable<ShareLinksTable>;
export type TeamInvitationRow = Selectable<TeamInvitationsTable>;
export type PasswordResetRow = Selectable<PasswordResetsTable>;
export type ReviewThreadRow = Selectable<ReviewThreadsTable>;
export type ReviewNoteRow = Selectable<ReviewNotesTable>;
export type AuditEventRow = Selectable<AuditEventsTable>;
