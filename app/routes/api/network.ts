import { z } from "zod";
import type { Route } from "./+types/network";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { apiError, issuesUnder, readJsonBody } from "#app/lib/api.server.ts";
import { revisionMessageSchema } from "#app/lib/fieldSchemas.ts";
import { currentDocument, deleteNetwork, saveNetworkDocument } from "#app/lib/networks.server.ts";
import { formatPath } from "#solver/schema.ts";

const putBodySchema = z.strictObject({
  revision: z.number().int().positive(),
  document: z.unknown(),
  message: revisionMessageSchema.optional(),
  /** From the sheet's autosave: the saves it knows are folded into `revision` (see writeRevision). */
  foldedSaves: z.number().int().min(0).optional(),
});

/** GET /api/networks/:id → { id, name, revision, role, document } */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network, role } = await requireApiNetwork(request, params, "view");
  const { document, foldedSaves } = await currentDocument(db, network);
  return Response.json({ id: network.id, name: network.name, revision: network.current_revision, foldedSaves, role, document });
}

/** PUT saves `{ revision, document }` as the next revision (409 when stale); DELETE deletes (owner). */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method === "PUT") {
    const { db, user, network, role } = await requireApiNetwork(request, params, "edit");
    const networkId = network.id;
    const parsed = putBodySchema.safeParse(await readJsonBody(request));
    if (!parsed.success) {
      return apiError(
        400,
        "The body must be { revision, document } with revision the number you last read.",
        parsed.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message })),
      );
    }
    const { revision, document, message, foldedSaves } = parsed.data;
    const saved = await saveNetworkDocument(db, { networkId, expectedRevision: revision, document, authorId: user.id, message, foldedSaves });
    if (!saved.ok && saved.reason === "invalid") {
      return apiError(400, "The network document is not valid; nothing was saved.", issuesUnder("document", saved.issues));
    }
    if (!saved.ok) {
      if (saved.currentRevision === null) return apiError(404, `There is no network ${networkId} that you can open.`);
      return Response.json(
        {
          error: `Revision ${revision} is not the current one: the network is at revision ${saved.currentRevision}. Nothing was saved; fetch it again and reapply your change.`,
          currentRevision: saved.currentRevision,
        },
        { status: 409 },
      );
    }
    // A draft is kept as it is; `problems` lists what the cross-element rules found (empty when complete).
    return Response.json({
      id: networkId,
      name: saved.document.name,
      revision: saved.revision,
      foldedSaves: saved.foldedSaves,
      role,
      document: saved.document,
      problems: saved.problems,
    });
  }

  if (request.method === "DELETE") {
    const { db, user, network } = await requireApiNetwork(request, params, "delete");
    const { restorableUntil } = await deleteNetwork(db, { network, by: user });
    return Response.json({ id: network.id, deleted: true, restorableUntil });
  }

  return Response.json(
    { error: `${request.method} is not supported here: use GET, PUT or DELETE.` },
    { status: 405, headers: { Allow: "GET, PUT, DELETE" } },
  );
}
