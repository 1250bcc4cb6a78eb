// The report's study part: every operating case, N-1 and the years of load growth (when the
// network gives a growth), with the same tables as the study page (StudyTables), or the sentence
// saying why the study is not in this report.
import { Link } from "react-router";
import { Notice } from "#app/components/Notice.tsx";
import { StudyTables } from "#app/components/study/StudyTables.tsx";
import type { StudyView } from "#app/lib/studyView.ts";
import "#app/components/study/study.css";

export interface ReportStudy {
  view: StudyView | null;
  /** Why the study is missing (refused, stopped, a network it cannot study). */
  error: string | null;
  withYears: boolean;
  /** Parts left to the study page on a large network, in a sentence. */
  skipped: string | null;
}

export function StudySection({ study, number, studyHref }: { study: ReportStudy; number: number; studyHref: string }) {
  return (
    <section className="ks-report-part" aria-labelledby="report-study">
      <h2 id="report-study">{number}. Operating cases, outages and years</h2>
      {study.view ? (
        <>
          <p>
            Each operating case solved as its own load flow ({study.view.cases.length} case{study.view.cases.length === 1 ? "" : "s"})
            {study.view.outages ? ", every line and transformer out in turn in each case (N-1)" : ""}
            {study.withYears ? ", and the load grown year by year over the network's horizon" : ""}: {study.view.loadFlows.toLocaleString("en-GB")} load flows in
            all. The <Link to={studyHref}>study page</Link> downloads each table as CSV.{study.skipped ? ` ${study.skipped[0].toUpperCase()}${study.skipped.slice(1)}` : ""}
          </p>
          <StudyTables view={study.view} level={3} />
        </>
      ) : (
        <Notice tone="info">The study is not part of this report: {study.error}</Notice>
      )}
    </section>
  );
}
