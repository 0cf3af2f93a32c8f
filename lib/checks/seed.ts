// Demo checks for the invented Larkspur Falls applications, made through the same service
// the app uses. Runs once: skipped when any deflection check exists. The lead calls
// `seedChecks(db())` from db/seed.ts after `seedApplications`.
import { and, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { applications, deflectionChecks, documents, sheets, users } from "@/db/schema";
import { DEFAULT_BEAM, type BeamFormInput } from "@/lib/checks/beam-form";
import { DEFAULT_OPTIONS } from "@/lib/checks/claims";
import { DEFAULT_MATERIAL } from "@/lib/checks/materials";
import { DEFAULT_SECTION } from "@/lib/checks/sections";
import { saveCheck, uploadMemberModel } from "@/lib/checks/service";

type Actor = { id: number; role: "applicant" | "technician" | "examiner" | "supervisor" | "admin"; name: string; firmId: number | null };

async function actor(database: Db, email: string): Promise<Actor | null> {
  const [u] = await database.select().from(users).where(eq(users.email, email)).limit(1);
  return u ? { id: u.id, role: u.role, name: u.name, firmId: u.firmId } : null;
}

// J-1 of the Riverbend Commons calc: 2x12 DF-L No.2 at 16 in o.c., 15'-6" span,
// D = 12 psf and L = 40 psf over 16/12 ft (16 plf and 53.3 plf); the calc claims 0.38 in.
const JOIST: BeamFormInput = {
  ...DEFAULT_BEAM,
  lengthUnit: "ft",
  spans: [{ length: "15.5" }],
  supports: ["pin", "roller"],
  section: { ...DEFAULT_SECTION, source: "sawn", nominal: "2x12", plies: "1" },
  material: { ...DEFAULT_MATERIAL, source: "lumber", lumber: "dfl-2" },
  loads: [
    { case: "D", type: "uniform", on: "all", w: "16", unit: "plf", wEnd: "", at: "", from: "", to: "", note: "12 psf × 16/12 ft" },
    { case: "L", type: "uniform", on: "all", w: "53.33", unit: "plf", wEnd: "", at: "", from: "", to: "", note: "40 psf × 16/12 ft" },
  ],
  row: "floor",
  creepMaterial: "sawn-dry",
  claims: [{ segment: "S1", combo: "L", delta: "0.38", unit: "in", location: "midspan" }],
};

// A header of the Quarry Lane draft, as Corbel & Finch would upload it beside their calc.
const HEADER_MODEL = {
  title: "16 Quarry Lane, garage door header GH-1 (demo)",
  description: "5-1/8 x 10-1/2 24F-1.8E glulam, 16 ft simple span; roof D 15 psf and S 25 psf over 12 ft.",
  kind: "beam",
  nodes: { A: ["0 ft", "0 ft"], B: ["16 ft", "0 ft"] },
  members: { GH1: { ends: ["A", "B"], E: "1800 ksi", I: "494.4 in^4", A: "53.81 in^2", note: "5.125 x 10.5 in glulam" } },
  supports: { A: "pin", B: "roller" },
  loads: [
    { member: "GH1", w: "-180 plf", case: "D", note: "15 psf x 12 ft" },
    { member: "GH1", w: "-300 plf", case: "S", note: "25 psf x 12 ft" },
  ],
  find: [{ node: "mid:GH1", dof: "y" }],
  checks: [{ id: "GH-1", member: "GH1", row: "roof-nonplaster-ceiling", material: "glulam", claimed: [{ combo: "S", delta: "0.50 in" }] }],
};

export async function seedChecks(database: Db): Promise<number> {
  const [any] = await database.select({ id: deflectionChecks.id }).from(deflectionChecks).limit(1);
  if (any) return 0;
  const henrik = await actor(database, "examiner@larkspurfalls.example");
  const owen = await actor(database, "owen@corbelfinch.example");
  if (!henrik || !owen) return 0;
  let added = 0;

  const [riverbend] = await database
    .select()
    .from(applications)
    .where(and(eq(applications.siteAddress, "1250 Alder Street"), eq(applications.assignedExaminerId, henrik.id), eq(applications.state, "in_review")))
    .limit(1);
  if (riverbend) {
    const [calc] = await database.select().from(documents).where(and(eq(documents.applicationId, riverbend.id), eq(documents.kind, "calculations"))).limit(1);
    const [s201] = await database.select().from(sheets).where(and(eq(sheets.applicationId, riverbend.id), eq(sheets.sheetNumber, "S-201"))).limit(1);
    await saveCheck(database, henrik, riverbend.id, {
      source: { form: "beam", title: "J-1 floor joists, 2x12 DF-L No.2 at 16 in o.c.", mark: "J-1", input: JOIST },
      options: DEFAULT_OPTIONS,
      purpose: "review",
      memberMark: "J-1",
      sheetId: s201?.id ?? null,
      calcDocumentId: calc?.id ?? null,
      calcPage: calc ? 3 : null,
    });
    added++;
  }

  const [quarry] = await database
    .select()
    .from(applications)
    .where(and(eq(applications.siteAddress, "16 Quarry Lane"), eq(applications.applicantId, owen.id), eq(applications.state, "draft")))
    .limit(1);
  if (quarry) {
    const bytes = new TextEncoder().encode(JSON.stringify(HEADER_MODEL, null, 2));
    const doc = await uploadMemberModel(database, owen, quarry.id, "gh-1-header.model.json", bytes);
    await saveCheck(database, owen, quarry.id, {
      source: { form: "model", model: HEADER_MODEL },
      options: DEFAULT_OPTIONS,
      purpose: "precheck",
      memberMark: "GH-1",
      calcDocumentId: doc.id,
    });
    added++;
  }
  return added;
}
