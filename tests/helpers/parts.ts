import fs from "node:fs";
import path from "node:path";

export const SAMPLES_DIR = path.resolve("samples");

export function sampleFiles(): string[] {
  return fs.readdirSync(SAMPLES_DIR).filter((n) => /\.(musicxml|mxl)$/.test(n)).sort();
}

export function multipartFile(fileName: string, bytes: Uint8Array, field = "file"): FormData {
  const form = new FormData();
  form.append(field, new Blob([new Uint8Array(bytes)]), fileName);
  return form;
}

/** Anything with a cookie-carrying fetch, like the signed-in client from tests/helpers/session. */
export interface Client {
  fetch(pathname: string, init?: RequestInit): Promise<Response>;
}

export async function uploadSample(client: Client, name: string): Promise<{ id: string; chosenPart: string; parts: { id: string; name: string }[] }> {
  const bytes = new Uint8Array(fs.readFileSync(path.join(SAMPLES_DIR, name)));
  const res = await client.fetch("/api/parts", { method: "POST", body: multipartFile(name, bytes) });
  if (res.status !== 201) throw new Error(`upload of ${name} answered ${res.status}: ${await res.text()}`);
  return res.json();
}
