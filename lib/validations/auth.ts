import { z } from "zod";
import { PASSWORD_MAX, PASSWORD_MIN } from "@/lib/auth/password-policy";
import { ROLES } from "@/lib/workflow/roles";

export const email = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, "E-mail address is too long.")
  // One plain address only: no display names, no lists, no quoted local parts.
  .regex(/^[a-z0-9._%+-]+@[a-z0-9.-]+\.[a-z]{2,}$/, "Enter one e-mail address, like name@example.com.");

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().min(1, "Enter your e-mail address.").max(254),
  password: z.string().min(1, "Enter your password.").max(PASSWORD_MAX),
});

export const newPasswordSchema = z
  .object({
    token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, "This link is not valid."),
    password: z
      .string()
      .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
      .max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters.`),
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords do not match." });

export const inviteSchema = z.object({
  email,
  name: z.string().trim().min(2, "Enter the person's name.").max(120),
  role: z.enum(ROLES, { error: "Choose a role." }),
  firmId: z.coerce.number().int().positive().optional(),
  title: z.string().trim().max(120).default(""),
});

export const updateUserSchema = z
  .object({
    version: z.number().int().positive(),
    role: z.enum(ROLES).optional(),
    status: z.enum(["active", "deactivated"]).optional(),
  })
  .refine((v) => v.role !== undefined || v.status !== undefined, { message: "Nothing to change." });

export const resetRequestSchema = z.object({ email });
