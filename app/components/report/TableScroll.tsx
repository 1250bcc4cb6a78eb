import type { ReactNode } from "react";

/**
 * A wide table scrolls sideways in its own box on screen, its first column (the names) kept in
 * view, so a phone never scrolls the whole report sideways; on paper the box lets it run full width.
 */
export function TableScroll({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="ks-table-scroll ks-report-scroll" tabIndex={0} role="region" aria-label={label}>
      {children}
    </div>
  );
}
