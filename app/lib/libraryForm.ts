// Reading what was typed into the library page's type form ("25 MVA", "0.12 ohm/km") into a
// checked type, on the server; the fields themselves are in libraryFields.ts.
import { libraryFields } from "./libraryFields.ts";
import { parseQuantity } from "./units.ts";
import {
  conductorTypeDataSchema,
  libraryTypeNameSchema,
  transformerTypeDataSchema,
  type ConductorTypeData,
  type LibraryTypeKind,
  type TransformerTypeData,
} from "./libraryTypes.ts";

export type TypeFormResult =
  | { ok: true; kind: LibraryTypeKind; name: string; data: TransformerTypeData | ConductorTypeData }
  | { ok: false; fieldErrors: Record<string, string> };

/** Reads the form's fields for a kind into a checked type; each problem lands beside its field. */
export function readTypeForm(kind: LibraryTypeKind, fields: Record<string, string>): TypeFormResult {
  const fieldErrors: Record<string, string> = {};
  const name = libraryTypeNameSchema.safeParse(fields.name ?? "");
  if (!name.success) fieldErrors.name = name.error.issues[0].message;
  const raw: Record<string, unknown> = {};
  for (const field of libraryFields[kind]) {
    const text = (fields[field.name] ?? "").trim();
    if (text === "") {
      if (!field.optional) fieldErrors[field.name] = "is required";
      continue;
    }
    if (field.choices) {
      if (!field.choices.includes(text)) fieldErrors[field.name] = `must be ${field.choices.join(" or ")}`;
      else raw[field.name] = field.name === "frequencyHz" ? Number(text) : text;
    } else if (field.number) {
      const value = Number(text.replace(/\s*mm(²|2)$/i, ""));
      if (Number.isFinite(value)) raw[field.name] = value;
      else fieldErrors[field.name] = "must be a number such as 300";
    } else if (field.kind) {
      const read = parseQuantity(text, field.kind);
      if (read.ok) raw[field.name] = read.value;
      else fieldErrors[field.name] = read.error;
    } else raw[field.name] = text;
  }
  if (Object.keys(fieldErrors).length > 0) return { ok: false, fieldErrors };
  const schema = kind === "transformer" ? transformerTypeDataSchema : conductorTypeDataSchema;
  const data = schema.safeParse(raw);
  if (!data.success) {
    for (const issue of data.error.issues) fieldErrors[String(issue.path[0] ?? "name")] ??= issue.message;
    return { ok: false, fieldErrors };
  }
  return { ok: true, kind, name: name.data!, data: data.data };
}
