// A reading's status as one cell for every table (sheet results, report, ladder): an icon and words
// besides its colour, and a plain sentence where there is no limit to judge against.
import { statusCue, type LimitStatus } from "#app/lib/limitStatus.ts";

export function StatusText({ status, none = "no limit given" }: { status: LimitStatus | undefined; none?: string }) {
  if (!status) return <span className="ks-muted">{none}</span>;
  const cue = statusCue[status];
  return (
    <span className={`ks-status ks-status-text ${cue.className}`}>
      <span aria-hidden="true">{cue.icon}</span> {cue.words}
    </span>
  );
}
