import type { ReactNode } from "react";

/** A message after an action: errors interrupt (role alert), confirmations wait their turn (status). */
export function Notice({ tone, children }: { tone: "ok" | "error" | "info"; children: ReactNode }) {
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`notice notice-${tone}`}>
      {tone === "ok" ? <span className="sr-only">Done: </span> : null}
      {tone === "error" ? <span className="sr-only">Problem: </span> : null}
      {children}
    </div>
  );
}
