import { Readable } from "node:stream";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { openDocument } from "@/lib/applications/documents";
import { requireUser } from "@/lib/auth/session";

// Authorized on every request; served so a browser never runs or sniffs it (ASVS 5.4, 3.2.1).
export const GET = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const { doc, stream } = await openDocument(db(), user, pathId(p.id, "That document"));
  const disposition = req.nextUrl.searchParams.get("download") === "1" ? "attachment" : "inline";
  const ascii = doc.originalName.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return new Response(Readable.toWeb(stream) as ReadableStream, {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(doc.byteSize),
      "content-disposition": `${disposition}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(doc.originalName)}`,
      "x-content-type-options": "nosniff",
      "content-security-policy": "sandbox; default-src 'none'",
      "cache-control": "private, no-store",
    },
  });
});
