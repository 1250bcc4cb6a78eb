// Follow a long calculation the server runs as a job: ask how far it got until it finishes, and
// cancel it on request. The answer of the request that started it is the first view.
import { useCallback, useEffect, useRef, useState } from "react";
import { jobPath, type JobView } from "#app/lib/compute/jobView.ts";

/** First ask soon (small networks finish at once), then less often. */
const POLL_MS = [150, 300, 500, 800, 1000];

function lost<R>(job: JobView<R>, error: string, status: number): JobView<R> {
  return { ...job, state: "failed", error, status, finishedAt: new Date().toISOString() };
}

async function readView<R>(job: JobView<R>, response: Response): Promise<JobView<R>> {
  if (response.ok) return (await response.json()) as JobView<R>;
  const text = (await response.text().catch(() => "")).trim();
  const sentence = text && !text.startsWith("<") && text.length < 400 ? text.replace(/^"|"$/g, "") : "The server could not say how the calculation is going. Reload the page and run it again.";
  return lost(job, sentence, response.status);
}

export function useJob<R>(started: JobView<R> | null): { job: JobView<R> | null; cancel: () => void; cancelling: boolean } {
  const [job, setJob] = useState<JobView<R> | null>(started);
  const [cancelling, setCancelling] = useState(false);
  const current = useRef(job);
  current.current = job;

  // A new job from the page replaces whatever was followed.
  useEffect(() => {
    setJob(started);
    setCancelling(false);
  }, [started]);

  useEffect(() => {
    if (!job || job.state !== "running") return;
    let stopped = false;
    let round = 0;
    let timer: ReturnType<typeof setTimeout>;
    const ask = async () => {
      try {
        const response = await fetch(jobPath(job), { headers: { Accept: "application/json" }, cache: "no-store" });
        const next = await readView(job, response);
        if (stopped) return;
        setJob(next);
        if (next.state === "running") timer = setTimeout(ask, POLL_MS[Math.min(++round, POLL_MS.length - 1)]);
      } catch {
        if (!stopped) timer = setTimeout(ask, POLL_MS[POLL_MS.length - 1]);
      }
    };
    timer = setTimeout(ask, POLL_MS[0]);
    return () => {
      stopped = true;
      clearTimeout(timer);
    };
    // Follow one job per id; the views it answers are not a reason to start again.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [job?.id, job?.state === "running"]);

  const cancel = useCallback(() => {
    const following = current.current;
    if (!following || following.state !== "running") return;
    setCancelling(true);
    fetch(jobPath(following), {
      method: "POST",
      headers: { Accept: "application/json" },
      body: new URLSearchParams({ intent: "cancel" }),
    })
      .then((response) => readView(following, response))
      .then((next) => setJob(next))
      .catch(() => setJob(lost(following, "The cancel did not reach the server; check the connection.", 0)))
      .finally(() => setCancelling(false));
  }, []);

  return { job, cancel, cancelling };
}
