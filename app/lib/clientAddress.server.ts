// Who is at the other end of the connection. The server (app/server.ts) puts the client's address
// into React Router's load context: the socket's own address, or what a proxy named in TRUST_PROXY
// says in X-Forwarded-For. Request headers are never read here: anyone can write them.
declare module "react-router" {
  interface AppLoadContext {
    /** The client's address as the server established it; absent under the Vite development server. */
    clientAddress?: string | null;
  }
}

export function clientAddressOf(context: { clientAddress?: string | null } | undefined): string | null {
  return context?.clientAddress ?? null;
}

/** True for this machine's own addresses (IPv4 127/8, IPv6 ::1, and IPv4 mapped into IPv6). */
export function isLoopback(address: string): boolean {
  const v4 = address.startsWith("::ffff:") ? address.slice("::ffff:".length) : address;
  return /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(v4) || address === "::1";
}
