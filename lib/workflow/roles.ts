// Who uses the portal. A role is a job in the department (or the applicant's side of the
// counter), not a permission: what each role may do lives in transitions.ts and permissions.ts.

export const ROLES = ["applicant", "technician", "examiner", "supervisor", "admin"] as const;

export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  applicant: "Applicant",
  technician: "Permit technician",
  examiner: "Plans examiner",
  supervisor: "Supervising examiner",
  admin: "Administrator",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
