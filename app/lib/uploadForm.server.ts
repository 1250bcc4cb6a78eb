// Reading the file an upload form sends (multipart/form-data, one file field), with the same size
// limit and sentences as the browser's own check. Never throws: every failure is a sentence.
import { uploadTooLarge } from "./imports/uploadLimits.ts";

export type UploadedFile =
  | { ok: true; fileName: string; text: string; byteLength: number; form: FormData }
  | { ok: false; error: string; form: FormData | null };

export async function readUploadedFile(request: Request, what: string, field = "file"): Promise<UploadedFile> {
  const type = request.headers.get("Content-Type") ?? "";
  if (!type.toLowerCase().startsWith("multipart/form-data"))
    return { ok: false, error: `Send ${what.toLowerCase()} as a form upload (multipart/form-data) in a field named "${field}".`, form: null };
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    return { ok: false, error: "The upload could not be read: the form data is cut short or malformed. Try again.", form: null };
  }
  const file = form.get(field);
  if (!(file instanceof File) || (file.size === 0 && file.name === ""))
    return { ok: false, error: `Choose ${what.toLowerCase()} to upload.`, form };
  const tooLarge = uploadTooLarge(file.size, what);
  if (tooLarge) return { ok: false, error: tooLarge, form };
  return { ok: true, fileName: file.name, text: await file.text(), byteLength: file.size, form };
}
