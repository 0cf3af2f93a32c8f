// Demo applications in the invented City of Larkspur Falls, driven through the same service
// functions the app uses (so every row, audit event and e-mail is what real use would make).
// Runs once: skipped when the demo applicant already has applications.
import { eq } from "drizzle-orm";
import { getApplicationRow } from "./queries/applications";
import { lockApplicationRow, lockLiveInvoicesForApplication } from "./queries/invoices";
import { applications, sheets, users } from "./schema";
import { withTransaction, type Db } from "./client";
import { uploadDocument } from "@/lib/applications/documents";
import { addComment, createApplication, fireEvent, respondToComment } from "@/lib/applications/service";
import { applyPayment } from "@/lib/payments/settle";
import { makeCalcPackage, makeDrawingSet } from "@/tests/fixtures/pdf/make";

const SET = [
  { number: "S-001", title: "GENERAL STRUCTURAL NOTES" },
  { number: "S-101", title: "FOUNDATION PLAN" },
  { number: "S-201", title: "SECOND FLOOR FRAMING PLAN" },
  { number: "S-202", title: "ROOF FRAMING PLAN" },
  { number: "S-301", title: "SHEAR WALL ELEVATIONS" },
  { number: "S-501", title: "TYPICAL DETAILS" },
];

const CALCS = [
  ["DESIGN CRITERIA", "2021 IBC, ASCE 7-16, NDS 2018", "Floor live load 40 psf (IBC Table 1607.1), dead 12 psf", "Roof snow 25 psf, roof dead 15 psf"],
  ["FB-3  Second floor beam", "Span L = 16'-0\"  trib 6'-0\"", "wD = 72 plf  wL = 240 plf", "Use 5-1/8 x 12 24F-1.8E glulam", "DL = 0.21 in < L/360 = 0.53 in  OK"],
  ["J-1  Floor joists 2x12 DF-L No.2 @ 16\" o.c.", "Span 15'-6\"", "DL = 0.38 in < L/360 = 0.52 in  OK"],
];

type Actor = { id: number; role: "applicant" | "technician" | "examiner" | "supervisor" | "admin"; name: string; firmId: number | null };

/**
 * The applicant paid the open fee online: the settlement a confirmed payment runs (paid invoice,
 * audit line, receipt, the held review clock started), so the story holds where the department
 * reviews only after payment. The reference is the demo's own, not a provider's.
 */
async function paidOnline(database: Db, applicationId: number, reference: string): Promise<void> {
  await withTransaction(database, async (tx) => {
    const app = (await lockApplicationRow(tx, applicationId))!;
    for (const inv of (await lockLiveInvoicesForApplication(tx, applicationId)).filter((i) => i.status === "open")) {
      await applyPayment(tx, inv, app, { sessionId: null, paymentId: `${reference}-${inv.id}`, amountCents: inv.totalCents, currency: inv.currency, via: "return" }, new Date(), []);
    }
  });
}

async function actorByEmail(database: Db, email: string): Promise<Actor> {
  const [u] = await database.select().from(users).where(eq(users.email, email)).limit(1);
  if (!u) throw new Error(`demo user ${email} missing: seed the accounts first`);
  return { id: u.id, role: u.role, name: u.name, firmId: u.firmId };
}

export async function seedApplications(database: Db): Promise<number> {
  const owen = await actorByEmail(database, "owen@corbelfinch.example");
  const lena = await actorByEmail(database, "lena@tamarackbuilders.example");
  const tech = await actorByEmail(database, "tech@larkspurfalls.example");
  const henrik = await actorByEmail(database, "examiner@larkspurfalls.example");
  const priya = await actorByEmail(database, "examiner2@larkspurfalls.example");
  const existing = await database.select({ id: applications.id }).from(applications).where(eq(applications.applicantId, owen.id)).limit(1);
  if (existing.length) return 0;

  const drawings = await makeDrawingSet({ sheets: SET });
  const calcs = await makeCalcPackage({ pages: CALCS });
  const v = async (id: number) => (await getApplicationRow(database, id))!.version;
  const base = {
    occupancyGroup: "R-3" as const,
    constructionType: "VB" as const,
    dporName: "Owen Corbel, PE",
    dporLicence: "PE-40211",
  };

  async function filed(who: Actor, fields: { workDescription: string; siteAddress: string; parcelNumber: string; valuation: number }, opts: { occupancy?: "B" | "R-2" | "R-3" } = {}) {
    const app = await createApplication(database, who, { ...base, ...fields, ...(opts.occupancy ? { occupancyGroup: opts.occupancy } : {}) });
    await uploadDocument(database, who, app.id, "drawings", "structural-drawings.pdf", drawings);
    await uploadDocument(database, who, app.id, "calculations", "structural-calculations.pdf", calcs);
    return app;
  }

  // 1. In review with Henrik, one draft comment; the plan-review fee still unpaid.
  const a1 = await filed(owen, { workDescription: "Two-story wood-frame duplex, Building B of Riverbend Commons", siteAddress: "1250 Alder Street", parcelNumber: "114-220-07", valuation: 61_500_000 }, { occupancy: "R-2" });
  await fireEvent(database, owen, a1.id, "submit", await v(a1.id));
  await fireEvent(database, tech, a1.id, "accept", await v(a1.id), { examinerId: henrik.id }, { checklist: { drawings: true, calculations: true, designData: true, seal: true } });
  const s201 = (await database.select().from(sheets).where(eq(sheets.applicationId, a1.id))).find((s) => s.sheetNumber === "S-201");
  await addComment(database, henrik, a1.id, {
    discipline: "Structural",
    sheetId: s201?.id ?? null,
    pinX: 0.42,
    pinY: 0.48,
    codeSection: "IBC 1604.3",
    codeEdition: "2021 IBC",
    body: "FB-3: the calculation shows live-load deflection only. Provide the D+L check against L/240 (Table 1604.3, floor members) including creep per footnote d.",
  });

  // 2. Corrections issued, one comment answered.
  const a2 = await filed(lena, { workDescription: "Tenant improvement with new mezzanine framing, steel W-beams", siteAddress: "88 Kiln Road, Suite 4", parcelNumber: "207-031-12", valuation: 23_000_000 }, { occupancy: "B" });
  await fireEvent(database, lena, a2.id, "submit", await v(a2.id));
  await fireEvent(database, tech, a2.id, "accept", await v(a2.id), { examinerId: priya.id });
  await paidOnline(database, a2.id, "demo-pay-kiln");
  const c1 = await addComment(database, priya, a2.id, { discipline: "Structural", codeSection: "IBC 1607.1", codeEdition: "2021 IBC", body: "Mezzanine live load: storage use requires 125 psf (Table 1607.1), not 50 psf as shown in the design criteria." });
  await addComment(database, priya, a2.id, { discipline: "Structural", codeSection: "IBC 1603.1.1", codeEdition: "2021 IBC", body: "Show the floor live loads on the construction documents as required for the mezzanine framing plan." });
  await fireEvent(database, priya, a2.id, "issue_corrections", await v(a2.id));
  await respondToComment(database, lena, a2.id, c1.id, { body: "Revised to 125 psf; beams upsized to W12x26.", changeReference: "Calc pages 3–5" });

  // 3. Waiting at intake.
  const a3 = await filed(owen, { workDescription: "Detached garage with bonus room, engineered roof trusses", siteAddress: "41 Heron Bend", parcelNumber: "118-004-33", valuation: 9_800_000 });
  await fireEvent(database, owen, a3.id, "submit", await v(a3.id));

  // 4. Approved with conditions.
  const a4 = await filed(owen, { workDescription: "Covered patio with glulam beam and cantilevered rafters", siteAddress: "903 Lantern Way", parcelNumber: "121-118-02", valuation: 4_200_000 });
  await fireEvent(database, owen, a4.id, "submit", await v(a4.id));
  await fireEvent(database, tech, a4.id, "accept", await v(a4.id), { examinerId: henrik.id });
  await paidOnline(database, a4.id, "demo-pay-lantern");
  await fireEvent(database, henrik, a4.id, "approve_with_conditions", await v(a4.id), { conditions: [{ text: "Deferred submittal: post base connector data before foundation inspection." }] });

  // 5. A draft still being prepared.
  await createApplication(database, owen, { ...base, workDescription: "Single-family residence, two stories, wood frame", siteAddress: "16 Quarry Lane", parcelNumber: "130-220-41", valuation: 72_000_000 });
  return 5;
}
