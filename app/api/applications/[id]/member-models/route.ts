import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { pathId, route } from "@/lib/api/handler";
import { clientIp } from "@/lib/auth/request-ip";
import { requireUser } from "@/lib/auth/session";
import { listMemberModels, MAX_MEMBER_MODEL_BYTES, uploadMemberModel } from "@/lib/checks/service";
import { AppError } from "@/lib/errors";

export const GET = route<{ id: string }>(async (_req, p) => {
  const user = await requireUser();
  return NextResponse.json(await listMemberModels(db(), user, pathId(p.id, "That application")));
});

// The model file is the raw body (application/json); its name travels URL-encoded in X-File-Name.
export const POST = route<{ id: string }>(async (req, p) => {
  const user = await requireUser();
  const id = pathId(p.id, "That application");
  let name = "";
  try {
    name = decodeURIComponent(req.headers.get("x-file-name") ?? "");
  } catch {
    throw new AppError("invalid_input", "The file name is not valid.", { file: "The file name is not valid." });
  }
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > MAX_MEMBER_MODEL_BYTES) throw new AppError("invalid_input", "The model file is larger than 1 MB.", { file: "Larger than 1 MB." });
  const body = new Uint8Array(await req.arrayBuffer());
  const model = await uploadMemberModel(db(), user, id, name, body, clientIp(req.headers));
  return NextResponse.json({ model }, { status: 201 });
});
