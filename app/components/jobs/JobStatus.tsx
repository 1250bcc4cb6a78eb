// A running calculation on a page: a progress bar with what it is doing, and a cancel button.
import type { JobView } from "#app/lib/compute/jobView.ts";
import "./jobs.css";

export function JobStatus({ job, cancelling, onCancel, what }: { job: JobView; cancelling: boolean; onCancel: () => void; what: string }) {
  if (job.state !== "running") return null;
  const progress = job.progress;
  const percent = progress && progress.total > 0 ? Math.round((100 * progress.done) / progress.total) : null;
  return (
    <div className="ks-job panel" role="status" aria-live="polite">
      <p className="ks-job-line">
        <span className="font-semibold">Running the {what}…</span> {progress ? progress.stage : "Starting."}
        {percent !== null ? ` (${percent} %)` : null}
      </p>
      <progress className="ks-job-bar" max={progress?.total || 1} value={progress?.done ?? 0} aria-label={`${what} progress`}>
        {percent ?? 0} %
      </progress>
      <button type="button" className="btn" onClick={onCancel} disabled={cancelling}>
        {cancelling ? "Cancelling…" : `Cancel the ${what}`}
      </button>
    </div>
  );
}
