// On the account page: whether to get an e-mail for each new review note on the networks of the
// teams one owns.
import { useFetcher } from "react-router";

export function NoteMailSetting({ value }: { value: "each" | "off" }) {
  const fetcher = useFetcher<{ ok: boolean; message: string }>();
  const pending = fetcher.formData?.get("reviewNoteMail");
  const current = pending === "each" || pending === "off" ? pending : value;
  return (
    <section aria-labelledby="note-mail-title" className="panel p-6">
      <h2 id="note-mail-title" className="text-lg">
        Review note e-mails
      </h2>
      <p className="mt-1 text-sm text-ink-muted">For the networks of teams you own.</p>
      <fetcher.Form method="post" action="/account/notifications" className="mt-3 space-y-2">
        <fieldset>
          <legend className="sr-only">When someone writes a review note</legend>
          <label className="flex items-center gap-2">
            <input type="radio" name="reviewNoteMail" value="each" defaultChecked={current === "each"} /> E-mail me each new note and reply
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" name="reviewNoteMail" value="off" defaultChecked={current === "off"} /> No e-mails; I read them on the sheet
          </label>
        </fieldset>
        <button type="submit" className="btn btn-small" disabled={fetcher.state !== "idle"}>
          Save
        </button>
        {fetcher.data ? (
          <p role={fetcher.data.ok ? "status" : "alert"} className="text-sm">
            {fetcher.data.message}
          </p>
        ) : null}
      </fetcher.Form>
    </section>
  );
}
