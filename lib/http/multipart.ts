import "server-only";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import type { IncomingMessage } from "node:http";
import formidable, { errors as formidableErrors, multipart } from "formidable";
import { AppError } from "@/lib/errors";

/** Room for a multipart body's boundaries and part headers beside the file itself. */
export const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

export interface ReceivedFile {
  fileName: string;
  bytes: Uint8Array;
}

/**
 * Streams a multipart body through formidable into a private temporary folder, never holding
 * more than `maxBytes` of it, and returns the one file in `field`. The folder is always removed.
 */
export async function receiveFile(request: Request, { field, maxBytes }: { field: string; maxBytes: number }): Promise<ReceivedFile> {
  const contentType = request.headers.get("content-type") ?? "";
  if (!contentType.startsWith("multipart/form-data")) {
    throw new AppError("unsupported:content_type", `Send the file as multipart/form-data in the field "${field}".`);
  }
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > maxBytes + MULTIPART_OVERHEAD_BYTES) throw fileTooLarge(maxBytes);
  if (!request.body) throw new AppError("bad_request:empty", "The upload is empty. Choose a MusicXML file and try again.");

  const dir = await fs.mkdtemp(path.join(os.tmpdir(), "ondula-upload-"));
  try {
    const headers: Record<string, string> = Object.fromEntries(request.headers);
    if (!headers["content-length"] && !headers["transfer-encoding"]) headers["transfer-encoding"] = "chunked";
    const stream = Readable.fromWeb(request.body as import("node:stream/web").ReadableStream) as Readable & { headers?: Record<string, string> };
    stream.headers = headers;
    const form = formidable({
      uploadDir: dir,
      maxFiles: 1,
      maxFileSize: maxBytes,
      maxTotalFileSize: maxBytes,
      maxFields: 10,
      maxFieldsSize: 64 * 1024,
      allowEmptyFiles: true,
      minFileSize: 0,
      // Only multipart: otherwise formidable would quietly parse JSON and urlencoded bodies too.
      enabledPlugins: [multipart],
    });
    let files: formidable.Files;
    try {
      [, files] = await form.parse(stream as unknown as IncomingMessage);
    } catch (err) {
      const e = err as { code?: number; httpCode?: number };
      if (e.code === formidableErrors.biggerThanTotalMaxFileSize || e.code === formidableErrors.biggerThanMaxFileSize || e.httpCode === 413) {
        throw fileTooLarge(maxBytes);
      }
      if (e.code === formidableErrors.maxFilesExceeded) throw new AppError("bad_request:files", "Upload one file at a time.");
      throw new AppError("bad_request:multipart", "The upload could not be read. Try again, or choose the file once more.");
    }
    const file = files[field]?.[0];
    if (!file) throw new AppError("bad_request:no_file", `No file was sent in the field "${field}". Choose a MusicXML file to upload.`, { field });
    const bytes = await fs.readFile(file.filepath);
    return { fileName: path.basename(file.originalFilename ?? "part.musicxml"), bytes: new Uint8Array(bytes) };
  } finally {
    await fs.rm(dir, { recursive: true, force: true });
  }
}

/** What a file over the upload limit answers (also when an upload's body is read whole first). */
export function fileTooLarge(maxBytes: number) {
  return new AppError(
    "too_large:file",
    `The file is larger than ${(maxBytes / 1024 / 1024).toFixed(0)} MB, the most Ondula accepts. Export only the part you need, or as compressed .mxl.`,
  );
}
