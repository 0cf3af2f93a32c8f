import { Readable } from "node:stream";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { parseRange } from "@/lib/api/range";
import { readableDocument } from "@/lib/applications/documents";
import { requireUser } from "@/lib/auth/session";

// Authorized on every request; served so a browser never runs or sniffs it (ASVS 5.4, 3.2.1).
// Byte ranges let the viewer fetch only the sheets being looked at.
export const GET = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const id = pathId(p.id, "That document");
  const { doc, open } = await readableDocument(db(), user, id);
  const size = doc.byteSize;
  const range = parseRange(req.headers.get("range"), size);
  const disposition = req.nextUrl.searchParams.get("download") === "1" ? "attachment" : "inline";
  const ascii = doc.originalName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  const headers: Record<string, string> = {
    // Stored at upload from our own check of the bytes (PDF or a member model's JSON), never from the client.
    "content-type": doc.contentType,
    "accept-ranges": "bytes",
    "content-disposition": `${disposition}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(doc.originalName)}`,
    "x-content-type-options": "nosniff",
    "content-security-policy": "sandbox; default-src 'none'",
    "cache-control": "private, no-store",
  };
  if (range === "unsatisfiable") {
    return new Response(null, { status: 416, headers: { ...headers, "content-range": `bytes */${size}` } });
  }
  const stream = await open(range ?? undefined);
  const length = range ? range.end - range.start + 1 : size;
  return new Response(Readable.toWeb(stream) as ReadableStream, {
    status: range ? 206 : 200,
    headers: { ...headers, "content-length": String(length), ...(range ? { "content-range": `bytes ${range.start}-${range.end}/${size}` } : {}) },
  });
});
