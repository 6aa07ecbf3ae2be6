import "server-only";
import { AppError } from "@/lib/api/errors";
import { IMPORT_KINDS, parseImportRequest, type ImportRequest } from "./options";

/** Room for the multipart envelope (boundaries, part headers, the options field) around the file. */
const ENVELOPE_BYTES = 64 * 1024;

function tooLarge(limitBytes: number): AppError {
  return new AppError(
    "payload_too_large",
    `The file is larger than ${Math.round(limitBytes / 1024 / 1024)} MB. Split it into smaller files.`,
    { file: "Too large" },
  );
}

/** The request body, read no further than `maxBytes`: a longer body is refused as soon as it gets there. */
async function readLimited(req: Request, maxBytes: number, limitBytes: number): Promise<Uint8Array> {
  const declared = Number(req.headers.get("content-length") ?? "NaN");
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(limitBytes);
  if (!req.body) return new Uint8Array();
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel();
      throw tooLarge(limitBytes);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** Reads a multipart import upload: the file, its kind and the options (JSON) for that kind. */
export async function readUpload(
  req: Request,
  limitBytes: number,
): Promise<{ fileName: string; bytes: Uint8Array; request: ImportRequest }> {
  const type = req.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("multipart/form-data")) {
    throw new AppError(
      "bad_request",
      "Send the file as multipart/form-data with the parts file, kind and options.",
    );
  }
  const body = await readLimited(req, limitBytes + ENVELOPE_BYTES, limitBytes);
  let form: FormData;
  try {
    form = await new Response(body as BodyInit, { headers: { "content-type": type } }).formData();
  } catch {
    throw new AppError("bad_request", "The multipart body could not be read.");
  }
  const file = form.get("file");
  if (!(file instanceof Blob))
    throw new AppError("invalid", "Attach the file to import.", { file: "Required" });
  if (file.size > limitBytes) throw tooLarge(limitBytes);
  const kind = form.get("kind");
  if (typeof kind !== "string" || !(IMPORT_KINDS as readonly string[]).includes(kind)) {
    throw new AppError("invalid", "Say what kind of file this is.", {
      kind: `One of ${IMPORT_KINDS.join(", ")}`,
    });
  }
  const optionsText = form.get("options");
  let options: unknown = {};
  if (typeof optionsText === "string" && optionsText.trim() !== "") {
    try {
      options = JSON.parse(optionsText);
    } catch {
      throw new AppError("invalid", "The options are not valid JSON.", { options: "Not valid JSON" });
    }
  }
  const fileName = "name" in file && typeof file.name === "string" && file.name ? file.name : "upload";
  return {
    fileName,
    bytes: new Uint8Array(await file.arrayBuffer()),
    request: parseImportRequest(kind as (typeof IMPORT_KINDS)[number], options),
  };
}
