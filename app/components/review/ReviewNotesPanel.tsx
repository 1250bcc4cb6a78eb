// Review notes beside the sheet: threads pinned to an element or to the sheet, replies, resolve
// and reopen, and a badge on every element with open notes. It sits inside the sheet editor
// (SheetEditor's `aside`), so it reads the selection to pin a new note and can bring a
// thread's element into view. Writes go to the network's notes route through a fetcher; the
// page's loader then hands in the new list.
import { useEffect, useMemo, useRef, useState } from "react";
import { Link, useFetcher } from "react-router";
import { useNodes, ViewportPortal } from "@xyflow/react";
import { useSheet, useSheetActions } from "#app/components/sheet/sheetStore.ts";
import { formatDateTime } from "#app/lib/format.ts";
import { elementsOf, kindWord } from "#app/lib/networkElements.ts";
import { GUEST_NAME_MAX, NOTE_BODY_MAX } from "#app/lib/fieldSchemas.ts";
import { openCountsByElement } from "#app/lib/reviewNotePermissions.ts";
import "./review.css";

export interface ReviewNote {
  id: number;
  authorName: string | null;
  /** Written through a view link without an account, under the name given. */
  guest: boolean;
  body: string;
  createdAt: string;
}

export interface ReviewThread {
  id: number;
  elementId: string | null;
  elementName: string | null;
  revision: number;
  createdAt: string;
  resolvedAt: string | null;
  resolvedByName: string | null;
  mayResolve: boolean;
  notes: ReviewNote[];
}

export interface ReviewNotesPanelProps {
  threads: ReviewThread[];
  mayWrite: boolean;
  signedIn: boolean;
  /** Where notes are posted; null when this reader only reads. */
  action: string | null;
  /** Where "sign in to write" comes back to. */
  signInBack: string;
}

type ActionAnswer = { ok: boolean; message: string };

/** Up to this many elements, "Pin to" lists them all; beyond, the element selected on the sheet. */
const PIN_LIST_MAX = 300;

function NoteBadges({ counts, onPick }: { counts: Record<string, number>; onPick: (elementId: string) => void }) {
  const nodes = useNodes();
  return (
    <ViewportPortal>
      {nodes
        .filter((node) => counts[node.id])
        .map((node) => {
          const width = node.width ?? node.measured?.width ?? 0;
          const height = node.height ?? node.measured?.height ?? 0;
          const count = counts[node.id];
          // A busbar's name sits above its bar, so its badge goes beside the bar's top end instead.
          const at = node.type === "bus" ? { x: node.position.x + width / 2 + 4, y: node.position.y - height / 2 } : { x: node.position.x + width / 2 - 6, y: node.position.y - height / 2 - 18 };
          return (
            <button
              key={node.id}
              type="button"
              className="ks-note-badge nodrag nopan"
              style={{ transform: `translate(${at.x}px, ${at.y}px)` }}
              onClick={() => onPick(node.id)}
              title={`${count} open review ${count === 1 ? "note" : "notes"}`}
            >
              <span aria-hidden="true">✎</span> {count}
              <span className="sr-only"> open review {count === 1 ? "note" : "notes"} on {(node.data as { element?: { name?: string } }).element?.name ?? "this element"}</span>
            </button>
          );
        })}
    </ViewportPortal>
  );
}

/** For a reader without an account: the name each note and reply is signed with (empty otherwise). */
function GuestNameField({ guestName }: { guestName: string | null }) {
  return guestName === null ? null : <input type="hidden" name="guestName" value={guestName} />;
}

function ThreadView({
  thread,
  action,
  mayWrite,
  guestName,
  onShow,
}: {
  thread: ReviewThread;
  action: string | null;
  mayWrite: boolean;
  guestName: string | null;
  onShow: (id: string) => void;
}) {
  const replyFetcher = useFetcher<ActionAnswer>();
  const statusFetcher = useFetcher<ActionAnswer>();
  const replyRef = useRef<HTMLFormElement>(null);
  const replying = replyFetcher.state !== "idle";
  useEffect(() => {
    if (replyFetcher.state === "idle" && replyFetcher.data?.ok) replyRef.current?.reset();
  }, [replyFetcher.state, replyFetcher.data]);
  const resolved = thread.resolvedAt !== null;
  const answer = replyFetcher.data ?? statusFetcher.data;
  return (
    <li className={`ks-thread${resolved ? " ks-thread-resolved" : ""}`} aria-labelledby={`ks-thread-${thread.id}`}>
      <div className="ks-thread-head">
        <h3 id={`ks-thread-${thread.id}`} className="ks-thread-title">
          {thread.elementId ? (
            <button type="button" className="ks-thread-pin" onClick={() => onShow(thread.elementId!)} title="Show on the sheet">
              {thread.elementName ?? thread.elementId}
            </button>
          ) : (
            <span>The sheet</span>
          )}
        </h3>
        <span className={`ks-thread-state ${resolved ? "ks-thread-state-done" : "ks-thread-state-open"}`}>
          <span aria-hidden="true">{resolved ? "✓ " : "● "}</span>
          {resolved ? "Resolved" : "Open"}
        </span>
      </div>
      <ol className="ks-thread-notes">
        {thread.notes.map((note) => (
          <li key={note.id}>
            <p className="ks-note-meta">
              <strong>{note.authorName ?? "A removed account"}</strong>
              {note.guest ? " (no account)" : ""} · {formatDateTime(note.createdAt)}
            </p>
            <p className="ks-note-body">{note.body}</p>
          </li>
        ))}
      </ol>
      <p className="ks-note-meta">
        Written on revision {thread.revision}
        {resolved ? ` · resolved${thread.resolvedByName ? ` by ${thread.resolvedByName}` : ""} ${formatDateTime(thread.resolvedAt!)}` : ""}
      </p>
      {action && mayWrite ? (
        <replyFetcher.Form method="post" action={action} className="ks-reply" ref={replyRef}>
          <input type="hidden" name="intent" value="reply" />
          <input type="hidden" name="threadId" value={thread.id} />
          <GuestNameField guestName={guestName} />
          <label className="sr-only" htmlFor={`ks-reply-${thread.id}`}>
            Reply to the note on {thread.elementName ?? "the sheet"}
          </label>
          <textarea id={`ks-reply-${thread.id}`} name="body" rows={2} maxLength={NOTE_BODY_MAX} required className="input ks-note-input" placeholder="Reply…" />
          <div className="ks-reply-actions">
            <button type="submit" className="btn btn-small" disabled={replying}>
              {replying ? "Sending…" : "Reply"}
            </button>
          </div>
        </replyFetcher.Form>
      ) : null}
      {action && thread.mayResolve ? (
        <statusFetcher.Form method="post" action={action} className="ks-thread-status-form">
          <input type="hidden" name="intent" value={resolved ? "reopen" : "resolve"} />
          <input type="hidden" name="threadId" value={thread.id} />
          <button type="submit" className="btn btn-small" disabled={statusFetcher.state !== "idle"}>
            {resolved ? "Reopen" : "Resolve"}
          </button>
        </statusFetcher.Form>
      ) : null}
      {answer && !answer.ok ? (
        <p className="ks-note-error" role="alert">
          {answer.message}
        </p>
      ) : null}
    </li>
  );
}

export function ReviewNotesPanel({ threads, mayWrite, signedIn, action, signInBack }: ReviewNotesPanelProps) {
  const actions = useSheetActions();
  const selection = useSheet((s) => s.selection);
  const savedDocument = useSheet((s) => s.savedDocument);
  const elements = useMemo(() => elementsOf(savedDocument), [savedDocument]);
  const counts = useMemo(() => openCountsByElement(threads), [threads]);
  const [filter, setFilter] = useState<string | null>(null);
  const [showResolved, setShowResolved] = useState(false);
  const [pinTo, setPinTo] = useState("");
  const [guestName, setGuestName] = useState("");
  const asGuest = !signedIn && mayWrite;
  const fetcher = useFetcher<ActionAnswer>();
  const formRef = useRef<HTMLFormElement>(null);
  const posting = fetcher.state !== "idle";

  const selected = selection.length === 1 && elements.some((e) => e.element.id === selection[0]) ? selection[0] : "";
  useEffect(() => setPinTo(selected), [selected]);
  useEffect(() => {
    if (fetcher.state === "idle" && fetcher.data?.ok) formRef.current?.reset();
  }, [fetcher.state, fetcher.data]);

  // A large drawing's every element would be tens of thousands of options: offer the selected one instead.
  const pinChoices = elements.length <= PIN_LIST_MAX ? elements : elements.filter((e) => e.element.id === selected);
  const open = threads.filter((t) => !t.resolvedAt).length;
  const resolvedCount = threads.length - open;
  const shown = threads.filter((t) => (filter === null || (t.elementId ?? "") === filter) && (showResolved || !t.resolvedAt));
  const filterName = filter === null ? null : filter === "" ? "the sheet" : (elements.find((e) => e.element.id === filter)?.element.name ?? "an element since removed");

  const pick = (elementId: string) => {
    setFilter(elementId);
    actions.focusElement(elementId);
  };

  return (
    <section className="ks-panel ks-review" aria-labelledby="ks-review-title" id="review-notes">
      <NoteBadges counts={counts} onPick={pick} />
      <header className="ks-panel-head">
        <h2 id="ks-review-title">Review notes</h2>
        <p className="ks-panel-sub" aria-live="polite">
          {open} open · {resolvedCount} resolved
        </p>
      </header>
      <div className="ks-panel-body">
        {action && asGuest ? (
          <div className="ks-guest-name">
            <label htmlFor="ks-guest-name" className="field-label">
              Your name
            </label>
            <input
              id="ks-guest-name"
              className="input"
              autoComplete="name"
              maxLength={GUEST_NAME_MAX}
              value={guestName}
              onChange={(e) => setGuestName(e.target.value)}
              aria-describedby="ks-guest-name-hint"
            />
            <p id="ks-guest-name-hint" className="field-hint">
              Notes without an account carry this name. <Link to={`/sign-in?${new URLSearchParams({ redirectTo: signInBack })}`}>Sign in</Link>{" "}
              to resolve notes too.
            </p>
          </div>
        ) : null}
        {action && mayWrite ? (
          <fetcher.Form method="post" action={action} className="ks-new-note" ref={formRef}>
            <input type="hidden" name="intent" value="start" />
            <GuestNameField guestName={asGuest ? guestName : null} />
            <label htmlFor="ks-note-pin" className="field-label">
              Pin to
            </label>
            <select id="ks-note-pin" name="elementId" className="input" value={pinTo} onChange={(e) => setPinTo(e.target.value)}>
              <option value="">The sheet as a whole</option>
              {pinChoices.map((e) => (
                <option key={e.element.id} value={e.element.id}>
                  {kindWord(e)}: {e.element.name}
                </option>
              ))}
            </select>
            {elements.length > PIN_LIST_MAX ? <p className="field-hint">Select an element on the sheet to pin the note to it.</p> : null}
            <label htmlFor="ks-note-body" className="field-label">
              Note
            </label>
            <textarea id="ks-note-body" name="body" rows={3} maxLength={NOTE_BODY_MAX} required className="input ks-note-input" />
            <button type="submit" className="btn btn-primary btn-small" disabled={posting}>
              {posting ? "Adding…" : "Add note"}
            </button>
            {fetcher.data ? (
              <p className={fetcher.data.ok ? "ks-note-ok" : "ks-note-error"} role={fetcher.data.ok ? "status" : "alert"}>
                {fetcher.data.message}
              </p>
            ) : null}
          </fetcher.Form>
        ) : !signedIn ? (
          <p className="ks-panel-note">
            <Link to={`/sign-in?${new URLSearchParams({ redirectTo: signInBack })}`}>Sign in</Link> to write review notes; reading needs no
            account.
          </p>
        ) : null}

        <div className="ks-review-filters">
          {filterName !== null ? (
            <p className="ks-panel-note">
              Notes on <strong>{filterName}</strong>.{" "}
              <button type="button" className="ks-link-button" onClick={() => setFilter(null)}>
                Show all
              </button>
            </p>
          ) : null}
          {resolvedCount > 0 ? (
            <label className="ks-review-toggle">
              <input type="checkbox" checked={showResolved} onChange={(e) => setShowResolved(e.target.checked)} /> Show resolved
            </label>
          ) : null}
        </div>

        {shown.length === 0 ? (
          <p className="ks-panel-note">{threads.length === 0 ? "No review notes yet." : "No open notes here."}</p>
        ) : (
          <ul className="ks-thread-list">
            {shown.map((thread) => (
              <ThreadView key={thread.id} thread={thread} action={action} mayWrite={mayWrite} guestName={asGuest ? guestName : null} onShow={pick} />
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}
