// Development-only pages (the mail fake's inbox) read other people's password and invitation
// links, so they answer only where that harms nobody: never in production, only while the mail
// fake runs, and only to a client on this machine. Under the Vite development server there is
// no load context to tell the address; that server listens on loopback unless told otherwise.
import { clientAddressOf, isLoopback } from "./clientAddress.server.ts";
import { env } from "./env.server.ts";
import { mailFakeRunning } from "./mail.server.ts";

export function mayOpenDevPages(context: { clientAddress?: string | null } | undefined): boolean {
  if (env.isProduction || !mailFakeRunning()) return false;
  const address = clientAddressOf(context);
  if (address === null) return import.meta.env?.DEV === true;
  return isLoopback(address);
}
