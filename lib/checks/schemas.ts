import { z } from "zod";
import { beamFormSchema } from "@/lib/checks/beam-form";
import { DEFAULT_OPTIONS, checkOptionsSchema } from "@/lib/checks/claims";
import { tableFormSchema } from "@/lib/checks/table-form";

// Request bodies of the check API, shared by the forms (through zodResolver) and the route
// handlers, so a field's message is the same before and after submit.

export const memberMarkSchema = z
  .string({ error: "Enter the member mark, e.g. FB-3." })
  .trim()
  .min(1, { error: "Enter the member mark, e.g. FB-3." })
  .max(40, { error: "The mark is too long (at most 40 characters)." });

const title = z.string().trim().max(160, { error: "The title is too long (at most 160 characters)." });

export const runSourceSchema = z.discriminatedUnion(
  "form",
  [
    z.object({ form: z.literal("model"), model: z.unknown() }),
    z.object({ form: z.literal("beam"), title, mark: memberMarkSchema, input: beamFormSchema }),
    z.object({ form: z.literal("table"), title, input: tableFormSchema }),
  ],
  { error: 'Say what is sent: { form: "model", model }, { form: "beam", … } or { form: "table", … }.' },
);

export type RunSource = z.infer<typeof runSourceSchema>;

export const runRequestSchema = z.object({
  source: runSourceSchema,
  options: checkOptionsSchema.default(DEFAULT_OPTIONS),
});

export type RunRequest = z.input<typeof runRequestSchema>;

const optionalId = z.number().int().positive().nullable().optional();

export const saveRequestSchema = runRequestSchema.extend({
  purpose: z.enum(["review", "precheck"], { error: "Say whether this is a review check or a pre-check." }),
  memberMark: memberMarkSchema,
  sheetId: optionalId,
  calcDocumentId: optionalId,
  calcPage: z.number({ error: "The calc page is a page number." }).int().positive({ error: "The calc page is a page number." }).max(100_000).nullable().optional(),
});

export type SaveRequest = z.input<typeof saveRequestSchema>;

export const batchRequestSchema = z.object({
  csv: z.string({ error: "Send the schedule as text in csv." }).max(400_000, { error: "The schedule is too large (at most 400 kB)." }),
  options: checkOptionsSchema.default(DEFAULT_OPTIONS),
});

/** The check-identity part of the new-check form (mark, sheet, calc page). */
export const checkIdentitySchema = z.object({
  memberMark: memberMarkSchema,
  title: title,
  sheetId: z.string(),
  calcDocumentId: z.string(),
  calcPage: z
    .string()
    .trim()
    .refine((v) => v === "" || /^\d{1,6}$/.test(v), { error: "The calc page is a page number." })
    .refine((v) => v === "" || Number(v) > 0, { error: "The calc page is a page number." }),
});

export type CheckIdentityInput = z.infer<typeof checkIdentitySchema>;
