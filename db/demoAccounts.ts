// The demo team and its three people (fictional). The passwords are public by design: the seed
// refuses to run in production, so these accounts exist only on development and test machines.
import type { TeamRole } from "./schema.ts";

export const DEMO_TEAM_NAME = "Calder Valley Planning";

export const DEMO_ACCOUNTS: readonly { role: TeamRole; name: string; email: string; password: string }[] = [
  { role: "owner", name: "Ada Thwaite", email: "ada.owner@kilostep.test", password: "tarn-head-owner" },
  { role: "editor", name: "Ewan Pickles", email: "ewan.editor@kilostep.test", password: "tarn-head-editor" },
  { role: "viewer", name: "Vera Birkett", email: "vera.viewer@kilostep.test", password: "tarn-head-viewer" },
];
