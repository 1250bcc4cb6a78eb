// Where the browser tests' server (serve.ts) leaves the address of its mail catcher's mailbox, so
// that the specs, which run in other processes, can read the messages the server sent.
export function mailboxFileFor(port: string | number): string {
  return `node_modules/.cache/kilostep-e2e-mailbox-${port}.url`;
}
