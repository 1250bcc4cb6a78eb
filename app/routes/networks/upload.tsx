import { useRef, useState } from "react";
import { useDropzone } from "react-dropzone";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/upload";
import { PathProblems } from "#app/components/ImportProblems.tsx";
import { NetworkFileSummary } from "#app/components/NetworkFileSummary.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { TeamSelect } from "#app/components/TeamSelect.tsx";
import { teamOfUser } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { readNetworkFile, type NetworkFilePreview, type NetworkFileReading } from "#app/lib/imports/networkFile.ts";
import { UPLOAD_LIMIT_BYTES } from "#app/lib/imports/uploadLimits.ts";
import { teamsToCreateIn } from "#app/lib/networkLists.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { readUploadedFile } from "#app/lib/uploadForm.server.ts";
import type { ValidationIssue } from "#solver/schema.ts";

export const meta: Route.MetaFunction = () => [{ title: "Upload a network file · Kilostep" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { teams: await teamsToCreateIn(await getDb(), user.id) };
}

/** What the page shows of a reading: never the whole document, which may be megabytes. */
interface ReadingSummary {
  ok: boolean;
  fileName: string | null;
  error?: string;
  issues: ValidationIssue[];
  totalIssues: number;
  preview: NetworkFilePreview | null;
}

function summary(fileName: string | null, reading: NetworkFileReading): ReadingSummary {
  return reading.ok
    ? { ok: true, fileName, issues: [], totalIssues: 0, preview: reading.preview }
    : { ok: false, fileName, error: reading.error, issues: reading.issues, totalIssues: reading.totalIssues, preview: reading.preview };
}

function refused(error: string, fileName: string | null = null) {
  return data<ReadingSummary>({ ok: false, fileName, error, issues: [], totalIssues: 0, preview: null }, { status: 400 });
}

/** "preview" reads and checks the file; "create" does the same and saves it only when all is well. */
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const upload = await readUploadedFile(request, "A network file");
  if (!upload.ok) return refused(upload.error);
  const teamId = parseId(String(upload.form.get("teamId") ?? ""));
  if (teamId === null) return refused("Choose the team the network belongs to.", upload.fileName);
  const { db } = await teamOfUser("page", user, teamId, "create-in-team");

  const reading = readNetworkFile(upload.text, upload.byteLength);
  if (!reading.ok) return data(summary(upload.fileName, reading), { status: 400 });
  if (upload.form.get("intent") !== "create") return summary(upload.fileName, reading);
  const created = await createNetwork(db, {
    teamId,
    document: reading.network,
    authorId: user.id,
    message: `Uploaded from ${upload.fileName || "a file"}`.slice(0, 500),
  });
  if (!created.ok) return refused(created.issues.map((i) => `${i.path}: ${i.message}`).join("; "), upload.fileName);
  return redirect(`/networks/${created.network.id}`);
}

function ReadingView({ reading }: { reading: ReadingSummary }) {
  return (
    <section aria-labelledby="upload-preview-title" className="panel mt-6 p-5">
      <h2 id="upload-preview-title" className="text-lg">
        {reading.fileName ? `What ${reading.fileName} holds` : "What the file holds"}
      </h2>
      <div className="mt-3">
        {reading.ok ? (
          <Notice tone="ok">The file is a valid network. Check what it holds, then create it.</Notice>
        ) : (
          <Notice tone="error">{reading.error} Nothing has been saved.</Notice>
        )}
      </div>
      {reading.preview ? (
        <div className="mt-4">
          <NetworkFileSummary preview={reading.preview} />
        </div>
      ) : null}
      <PathProblems issues={reading.issues} total={reading.totalIssues} />
    </section>
  );
}

export default function UploadNetwork({ loaderData, actionData }: Route.ComponentProps) {
  const { teams } = loaderData;
  const navigation = useNavigation();
  const busy = navigation.state === "submitting";
  const fileInput = useRef<HTMLInputElement>(null);
  const [local, setLocal] = useState<ReadingSummary | null>(null);

  /** The browser reads and checks the file at once; the server checks it again before saving. */
  async function preview(file: File | undefined) {
    if (!file) return setLocal(null);
    if (file.size > UPLOAD_LIMIT_BYTES) return setLocal(summary(file.name, readNetworkFile("", file.size)));
    setLocal(summary(file.name, readNetworkFile(await file.text(), file.size)));
  }

  const { getRootProps, isDragActive } = useDropzone({
    noClick: true,
    noKeyboard: true,
    multiple: false,
    onDrop(accepted) {
      const file = accepted[0];
      if (file && fileInput.current) {
        // Put the dropped file into the form's own input, so submitting sends it like a picked one.
        const transfer = new DataTransfer();
        transfer.items.add(file);
        fileInput.current.files = transfer.files;
      }
      void preview(file);
    },
  });

  const shown = local ?? actionData ?? null;
  if (teams.length === 0)
    return (
      <>
        <PageTitle title="Upload a network file" />
        <Notice tone="info">
          You are not an editor or owner of any team, so you cannot create networks. <Link to="/teams/new">Create a team</Link> of your own.
        </Notice>
      </>
    );

  return (
    <>
      <PageTitle
        title="Upload a network file"
        lead="A Kilostep network file (JSON, at most 5 MB): checked and previewed before anything is saved."
        actions={<Link to="/networks">← Networks</Link>}
      />
      <Form method="post" encType="multipart/form-data" className="panel space-y-4 p-5" onSubmit={() => setLocal(null)}>
        <div
          {...getRootProps({
            className: `rounded border-2 border-dashed p-6 text-center ${isDragActive ? "border-accent bg-accent-wash" : "border-paper-rule"}`,
          })}
        >
          <p className="mb-3 text-ink-soft">Drop a network file here, or choose one.</p>
          <label htmlFor="network-file" className="field-label">
            Network file
          </label>
          <input
            ref={fileInput}
            id="network-file"
            type="file"
            name="file"
            accept=".json,application/json"
            className="mx-auto block"
            onChange={(event) => void preview(event.currentTarget.files?.[0])}
          />
        </div>
        <TeamSelect id="upload-team" teams={teams} />
        <div className="flex flex-wrap gap-2">
          <button type="submit" name="intent" value="preview" className="btn" disabled={busy}>
            Check the file
          </button>
          <button type="submit" name="intent" value="create" className="btn btn-primary" disabled={busy || shown?.ok === false}>
            {busy ? "Working…" : "Create network"}
          </button>
        </div>
      </Form>
      {shown ? <ReadingView reading={shown} /> : null}
    </>
  );
}
