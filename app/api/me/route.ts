import { NextResponse } from "next/server";
import { route } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";

export const GET = route(async () => {
  const u = await requireUser();
  return NextResponse.json({ user: { id: u.id, name: u.name, email: u.email, role: u.role } });
});
