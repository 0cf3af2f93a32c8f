import type { NextRequest } from "next/server";
import { route } from "@/lib/api/handler";
import { handlers } from "@/lib/auth/config";

export const { GET } = handlers;

// Sign-in and sign-out change state: the same Origin and reserved-header checks as every other route.
export const POST = route((req: NextRequest) => handlers.POST(req));
