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
