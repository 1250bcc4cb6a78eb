import { useRef, useState } from "react";
import { useDropzone } from "react-dropzone";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/upload";
import { PathProblems } from "#app/components/ImportProblems.tsx";
import { NetworkFileSummary } from "#app/components/NetworkFileSummary.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { TeamSelect } from "#app/components/TeamSelect.tsx";
import { networkOfUser, teamOfUser } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { requireUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { readNetworkFile, type NetworkFilePreview, type NetworkFileReading } from "#app/lib/imports/networkFile.ts";
import { UPLOAD_LIMIT_BYTES } from "#app/lib/imports/uploadLimits.ts";
import { networksOfUser, teamsToCreateIn } from "#app/lib/networkLists.server.ts";
import { nameKey, nextFreeName } from "#app/lib/networkNames.ts";
import { createNetwork, saveNetworkDocument } from "#app/lib/networks.server.ts";
import { readUploadedFile } from "#app/lib/uploadForm.server.ts";
import type { ValidationIssue } from "#solver/schema.ts";

export const meta: Route.MetaFunction = () => [{ title: "Upload a network file · Kilostep" }];

/** The networks of the teams one may create in: enough to say at once that a file's name is taken. */
async function networksToUploadBeside(db: Awaited<ReturnType<typeof getDb>>, userId: number) {
  const [teams, { own }] = await Promise.all([teamsToCreateIn(db, userId), networksOfUser(db, userId)]);
  const teamIds = new Set(teams.map((t) => t.id));
  return { teams, existing: own.filter((n) => teamIds.has(n.teamId)).map(({ id, name, teamId, revision }) => ({ id, name, teamId, revision })) };
}

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return networksToUploadBeside(await getDb(), user.id);
}

type ExistingNetwork = { id: number; name: string; teamId: number; revision: number };

/** A live network of the team with the file's name, if any: uploading again must not make a twin by accident. */
function sameNamed(existing: ExistingNetwork[], teamId: number, name: string): ExistingNetwork | undefined {
  const key = nameKey(name);
  return existing.find((n) => n.teamId === teamId && nameKey(n.name) === key);
}

/** When the file's name is taken in the team: its next revision, or a network of its own under a free name. */
const SAME_NAME_CHOICES = ["revision", "copy"] as const;
type SameNameChoice = (typeof SAME_NAME_CHOICES)[number];

/** What the page shows of a reading: never the whole document, which may be megabytes. */
interface ReadingSummary {
  ok: boolean;
  fileName: string | null;
  error?: string;
  issues: ValidationIssue[];
  totalIssues: number;
  preview: NetworkFilePreview | null;
  /** A network of the chosen team that already has the file's name; the planner must say what to do. */
  sameName?: ExistingNetwork;
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
  const { existing } = await networksToUploadBeside(db, user.id);
  const twin = sameNamed(existing, teamId, reading.network.name);
  const read = { ...summary(upload.fileName, reading), sameName: twin };
  if (upload.form.get("intent") !== "create") return read;

  const message = `Uploaded from ${upload.fileName || "a file"}`.slice(0, 500);
  const choice = String(upload.form.get("sameName") ?? "");
  if (twin && !SAME_NAME_CHOICES.includes(choice as SameNameChoice))
    return data(
      { ...read, ok: false, error: `The team already has a network named "${twin.name}". Choose whether the file becomes its next revision or a network of its own.` },
      { status: 409 },
    );
  if (twin && choice === "revision") {
    const { network } = await networkOfUser(user, twin.id, "edit");
    // The planner chose with the revision the page showed; a save since then must not be overwritten unseen.
    const seen = parseId(String(upload.form.get("sameNameRevision") ?? ""));
    const saved = await saveNetworkDocument(db, { networkId: network.id, expectedRevision: seen ?? -1, document: reading.network, authorId: user.id, message });
    if (!saved.ok && saved.reason === "stale")
      return data(
        { ...read, ok: false, error: `"${twin.name}" was saved since you looked (it is now at revision ${saved.currentRevision}). Nothing was saved; check the file again.` },
        { status: 409 },
      );
    if (!saved.ok) return refused(saved.issues.map((i) => `${i.path}: ${i.message}`).join("; "), upload.fileName);
    return redirect(`/networks/${network.id}`);
  }
  const document = twin
    ? { ...reading.network, name: nextFreeName(reading.network.name, existing.filter((n) => n.teamId === teamId).map((n) => n.name)) }
    : reading.network;
  const created = await createNetwork(db, { teamId, document, authorId: user.id, message });
  if (!created.ok) return refused(created.issues.map((i) => `${i.path}: ${i.message}`).join("; "), upload.fileName);
  return redirect(`/networks/${created.network.id}`);
}

/** Asked when the chosen team already has a network of the file's name. */
function SameNameChoiceField({ twin, freeName }: { twin: ExistingNetwork; freeName: string }) {
  return (
    <fieldset className="rounded border border-paper-rule p-4">
      <legend className="field-label px-1">The team already has a network named “{twin.name}”</legend>
      <input type="hidden" name="sameNameRevision" value={twin.revision} />
      <label className="flex items-start gap-2">
        <input type="radio" name="sameName" value="revision" required className="mt-1" />
        <span>
          Save the file as its next revision (now at revision {twin.revision}; the earlier ones stay in its history).{" "}
          <Link to={`/networks/${twin.id}`}>Open “{twin.name}”</Link>
        </span>
      </label>
      <label className="mt-2 flex items-start gap-2">
        <input type="radio" name="sameName" value="copy" required className="mt-1" />
        <span>Create a network of its own, named “{freeName}”.</span>
      </label>
    </fieldset>
  );
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
  const { teams, existing } = loaderData;
  const [teamId, setTeamId] = useState<number | undefined>(teams[0]?.id);
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
  // Only a file that can be saved raises the question of where it goes.
  const fileName = shown && (shown.ok || shown.sameName) ? shown.preview?.name : undefined;
  const twin = fileName && teamId !== undefined ? sameNamed(existing, teamId, fileName) : undefined;
  const freeName = twin && fileName ? nextFreeName(fileName, existing.filter((n) => n.teamId === teamId).map((n) => n.name)) : "";
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
        <TeamSelect id="upload-team" teams={teams} onChange={setTeamId} />
        {twin ? <SameNameChoiceField twin={twin} freeName={freeName} /> : null}
        <div className="flex flex-wrap gap-2">
          <button type="submit" name="intent" value="preview" className="btn" disabled={busy}>
            Check the file
          </button>
          <button type="submit" name="intent" value="create" className="btn btn-primary" disabled={busy || (shown?.ok === false && !shown.sameName)}>
            {busy ? "Working…" : twin ? "Save" : "Create network"}
          </button>
        </div>
      </Form>
      {shown ? <ReadingView reading={shown} /> : null}
    </>
  );
}
