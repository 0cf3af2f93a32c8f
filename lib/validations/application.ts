import { z } from "zod";
import { EVENTS } from "@/lib/workflow";

// IBC 2021 §302.1 occupancy groups and Table 601 construction types (from memory; the
// adopted local edition governs).
export const OCCUPANCY_GROUPS = [
  "A-1", "A-2", "A-3", "A-4", "A-5", "B", "E", "F-1", "F-2", "H-1", "H-2", "H-3", "H-4", "H-5",
  "I-1", "I-2", "I-3", "I-4", "M", "R-1", "R-2", "R-3", "R-4", "S-1", "S-2", "U",
] as const;
export const CONSTRUCTION_TYPES = ["IA", "IB", "IIA", "IIB", "IIIA", "IIIB", "IV-A", "IV-B", "IV-C", "IV-HT", "VA", "VB"] as const;

const text = (label: string, max: number, min = 1) =>
  z.string({ error: `Enter the ${label}.` }).trim().min(min, `Enter the ${label}.`).max(max, `The ${label} is too long (at most ${max} characters).`);

export const applicationSchema = z.object({
  workDescription: text("description of work", 2000, 10),
  siteAddress: text("site address", 200, 5),
  parcelNumber: z.string().trim().regex(/^[0-9A-Za-z-]{4,40}$/, "Enter the parcel number (letters, digits and dashes)."),
  occupancyGroup: z.enum(OCCUPANCY_GROUPS, { error: "Choose the occupancy group (IBC chapter 3)." }),
  constructionType: z.enum(CONSTRUCTION_TYPES, { error: "Choose the construction type (IBC Table 601)." }),
  // Dollars as typed ("1,250,000" or "1250000.50"), stored as integer cents.
  valuation: z
    .union([z.string(), z.number()])
    .transform((v) => String(v).replace(/[$,\s]/g, ""))
    .refine((v) => /^\d{1,11}(\.\d{1,2})?$/.test(v), "Enter the valuation in dollars, e.g. 480000.")
    .transform((v) => {
      const [whole, frac = ""] = v.split(".");
      return Number(whole) * 100 + Number(frac.padEnd(2, "0"));
    })
    .refine((c) => c > 0, "The valuation must be more than zero."),
  dporName: text("name of the design professional of record", 120, 3),
  dporLicence: z.string().trim().regex(/^[A-Za-z0-9-]{3,40}$/, "Enter the licence number (letters, digits and dashes)."),
});

export type ApplicationInput = z.output<typeof applicationSchema>;

export const eventSchema = z.object({
  event: z.enum(EVENTS, { error: "Unknown action." }),
  version: z.number().int().positive(),
  input: z.unknown().optional(),
  checklist: z.record(z.string(), z.boolean()).optional(),
});

export const DISCIPLINES = ["Structural", "Architectural", "Fire and life safety", "Accessibility", "Energy", "Mechanical", "Plumbing", "Electrical", "General"] as const;

export const commentSchema = z.object({
  discipline: z.enum(DISCIPLINES, { error: "Choose a discipline." }),
  sheetId: z.number().int().positive().nullable().optional(),
  pinX: z.number().min(0).max(1).nullable().optional(),
  pinY: z.number().min(0).max(1).nullable().optional(),
  codeSection: z
    .string()
    .trim()
    .min(3, "Cite the code section, e.g. IBC 1604.3.")
    .max(60)
    .regex(/^[A-Za-z][A-Za-z0-9 .,§()\-–/]+$/, "Cite the code section like “IBC 1604.3” or “ASCE 7-16 §12.8”."),
  codeEdition: z.string().trim().min(4, "State the code edition, e.g. 2021 IBC.").max(30),
  body: z.string().trim().min(10, "Write the comment: what is wrong and what is needed.").max(4000),
});

export const commentUpdateSchema = commentSchema.partial().extend({ version: z.number().int().positive() });

export const responseSchema = z.object({
  body: z.string().trim().min(3, "Write your response to this comment.").max(4000),
  changeReference: z.string().trim().max(120).default(""),
  documentId: z.number().int().positive().nullable().optional(),
});

export const verdictSchema = z.object({
  verdict: z.enum(["resolved", "not_resolved"], { error: "Choose resolved or not resolved." }),
});
