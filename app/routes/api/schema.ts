import { networkJsonSchema } from "#solver/schema.ts";

/** The network file's JSON Schema, for anyone (no sign-in): editors and scripts validate against it. */
export function loader() {
  return Response.json(networkJsonSchema(), { headers: { "Cache-Control": "public, max-age=300" } });
}
