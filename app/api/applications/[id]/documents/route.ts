import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { uploadDocument } from "@/lib/applications/documents";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";

const kind = z.enum(["drawings", "calculations", "response_letter"], { error: "Choose what the file is: drawings, calculations or response letter." });

// The file is the raw request body (application/pdf), streamed to storage; its name travels
// URL-encoded in X-File-Name so no multipart parsing is needed.
export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const id = pathId(p.id, "That application");
  const k = kind.safeParse(req.nextUrl.searchParams.get("kind"));
  if (!k.success) throw new AppError("invalid_input", k.error.issues[0]!.message, { kind: k.error.issues[0]!.message });
  let name = "";
  try {
    name = decodeURIComponent(req.headers.get("x-file-name") ?? "");
  } catch {
    throw new AppError("invalid_input", "The file name is not valid.", { file: "The file name is not valid." });
  }
  if (!req.body) throw new AppError("invalid_input", "The file is empty.", { file: "The file is empty." });
  const r = await uploadDocument(db(), user, id, k.data, name, req.body, clientIp(req.headers));
  return NextResponse.json({ document: r }, { status: 201 });
});
