// The invented demo department's firms and accounts (listed in the README). No imports with side
// effects: browser tests read this file too.
import type { Role } from "@/lib/workflow/roles";

export const DEMO_PASSWORD = "spanproof-demo";

export const DEMO_FIRMS = [
  { name: "Corbel & Finch Structural", kind: "design", city: "Larkspur Falls" },
  { name: "Tamarack Builders", kind: "contractor", city: "Larkspur Falls" },
  { name: "Quarry Lane Architects", kind: "design", city: "Eastmere" },
] as const;

export const DEMO_USERS: { email: string; name: string; role: Role; title: string; firm?: string }[] = [
  { email: "admin@larkspurfalls.example", name: "Rosa Quintero", role: "admin", title: "Systems administrator" },
  { email: "tech@larkspurfalls.example", name: "Marisol Okafor", role: "technician", title: "Permit technician" },
  { email: "examiner@larkspurfalls.example", name: "Henrik Alvarado", role: "examiner", title: "Plans examiner, structural" },
  { email: "examiner2@larkspurfalls.example", name: "Priya Lindqvist", role: "examiner", title: "Plans examiner" },
  { email: "supervisor@larkspurfalls.example", name: "Gwen Tanaka", role: "supervisor", title: "Supervising plans examiner" },
  { email: "owen@corbelfinch.example", name: "Owen Corbel", role: "applicant", title: "Principal, PE", firm: "Corbel & Finch Structural" },
  { email: "lena@tamarackbuilders.example", name: "Lena Marsh", role: "applicant", title: "Project manager", firm: "Tamarack Builders" },
];
