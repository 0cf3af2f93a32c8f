import { NextResponse } from "next/server";
import { z } from "zod";
import { db } from "@/db/client";
import { countQueue, listQueuePage, QUEUE_STATES, sortKeyOf, type QueueCursor, type QueueRow, type QueueSort, type SortDir } from "@/db/queries/queue";
import { route } from "@/lib/api/handler";
import { requireRole } from "@/lib/auth/session";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { dayInZone, endOfDayInZone, weekEnd } from "@/lib/review-clock";
import { presentQueueRow, type QueueApiPage } from "@/lib/review-clock/queue-row";
import { loadCalendarCached } from "@/lib/review-clock/server";

const query = z.object({
  state: z.enum(QUEUE_STATES).optional(),
  examinerId: z.coerce.number().int().positive().optional(),
  due: z.enum(["overdue", "this_week"]).optional(),
  sort: z.enum(["due", "received", "number"]).default("due"),
  dir: z.enum(["asc", "desc"]).default("asc"),
  cursor: z.string().max(200).optional(),
  limit: z.coerce.number().int().min(10).max(100).default(50),
});

const cursorSchema = z.object({ s: z.enum(["due", "received", "number"]), d: z.enum(["asc", "desc"]), k: z.string().nullable(), i: z.number().int().positive() });

function encodeCursor(row: QueueRow, sort: QueueSort, dir: SortDir): string {
  const k = sortKeyOf(row, sort);
  const key = k instanceof Date ? k.toISOString() : k === null ? null : String(k);
  return Buffer.from(JSON.stringify({ s: sort, d: dir, k: key, i: row.id })).toString("base64url");
}

function decodeCursor(raw: string, sort: QueueSort, dir: SortDir): QueueCursor {
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(raw, "base64url").toString("utf8"));
  } catch {
    parsed = null;
  }
  const c = cursorSchema.safeParse(parsed);
  if (!c.success || (c.data.k !== null && sort !== "number" && Number.isNaN(Date.parse(c.data.k)))) {
    throw new AppError("invalid_input", "That page link is not valid. Start again from the first page.", { cursor: "Not a page cursor." });
  }
  if (c.data.s !== sort || c.data.d !== dir) {
    throw new AppError("invalid_input", "That page link belongs to another sort order. Start again from the first page.", { cursor: "Sort order changed." });
  }
  return { key: c.data.k, id: c.data.i };
}

// Open reviews for the supervising examiner: filters, sort and keyset pages (cursor = the last
// row's sort key and id): on the indexed sorts (due, number) page 2,000 costs what page 1 costs.
export const GET = route(async (req) => {
  await requireRole("supervisor");
  const q = query.parse(Object.fromEntries(req.nextUrl.searchParams));
  const now = new Date();
  const today = dayInZone(now);
  const filter = {
    states: q.state ? [q.state] : QUEUE_STATES,
    examinerId: q.examinerId,
    due: q.due,
    now,
    weekEndsAt: endOfDayInZone(weekEnd(today)),
  };
  const after = q.cursor ? decodeCursor(q.cursor, q.sort, q.dir) : undefined;
  const database = db();
  const [page, cal, total] = await Promise.all([
    listQueuePage(database, { ...filter, sort: q.sort, dir: q.dir, after, limit: q.limit }),
    loadCalendarCached(database),
    after ? Promise.resolve(null) : countQueue(database, filter),
  ]);
  const last = page.rows.at(-1);
  const body: QueueApiPage = {
    rows: page.rows.map((r) => presentQueueRow(r, today, cal, { feeBeforeReview: env().PAYMENT_REQUIRED_BEFORE_REVIEW })),
    nextCursor: page.hasMore && last ? encodeCursor(last, q.sort, q.dir) : null,
    total,
    today,
  };
  return NextResponse.json(body);
});
