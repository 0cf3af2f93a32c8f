// Fixtures for the access matrix: two applicant firms of the invented City of Larkspur Falls,
// one account per department role and one deactivated account, and for the first firm an
// application in each state the matrix is read in (draft, in review, corrections issued),
// built through the app's own API so every row is what the service layer wrote.
import { createServer, type Server } from "node:http";
import mysql from "mysql2/promise";
import { hashPassword } from "@/lib/auth/password";
import type { AccessActor } from "@/lib/security/access-matrix";
import { makeCalcPackage, makeDrawingSet } from "../../fixtures/pdf/make";
import { api, readAnswer, signIn } from "./app";
import { FB3_MODEL } from "@/tests/fixtures/fb3-model";

export const PASSWORD = "correct horse battery staple";

export const APPLICATION_INPUT = {
  workDescription: "Second-floor addition with a glulam floor beam FB-3",
  siteAddress: "77 Millwright Court, Larkspur Falls",
  parcelNumber: "119-402-18",
  occupancyGroup: "R-3",
  constructionType: "VB",
  valuation: 185000,
  dporName: "Owen Corbel, PE",
  dporLicence: "PE-40211",
};


export { FB3_MODEL };

export const COMMENT = { discipline: "Structural", codeSection: "IBC 1604.3", codeEdition: "2021 IBC", body: "Show the deflection of FB-3 under live load against L/360." };

export interface FirmFixture {
  draft: { id: number; version: number; drawingsId: number };
  review: { id: number; drawingsId: number; calcId: number; modelId: number; checkId: number; commentId: number; spareComments: number[]; invoiceId: number };
  corrections: { id: number; checkId: number; commentId: number };
}

export interface AccessFixtures {
  cookies: Record<Exclude<AccessActor, "signed_out">, string>;
  users: Record<Exclude<AccessActor, "signed_out">, number>;
  a: FirmFixture;
  /** the other firm's own draft, for swapping the first firm's ids into its paths and bodies */
  b: { draftId: number };
  holiday: string;
}

async function must<T>(p: Promise<{ status: number; json: unknown }>, what: string): Promise<T> {
  const r = await p;
  if (r.status >= 300) throw new Error(`fixture step "${what}" failed: HTTP ${r.status} ${JSON.stringify(r.json).slice(0, 400)}`);
  return r.json as T;
}

export async function upload(baseUrl: string, cookie: string, path: string, name: string, body: Uint8Array | string, contentType: string) {
  const res = await fetch(`${baseUrl}${path}`, {
    method: "POST",
    headers: { cookie, origin: baseUrl, "content-type": contentType, "x-file-name": encodeURIComponent(name) },
    body: typeof body === "string" ? body : Buffer.from(body),
  });
  return readAnswer(res);
}

async function version(baseUrl: string, cookie: string, id: number): Promise<number> {
  const v = await must<{ application: { version: number } }>(api(baseUrl, cookie, "GET", `/api/applications/${id}`), "read version");
  return v.application.version;
}

async function newApplication(baseUrl: string, cookie: string) {
  const { application } = await must<{ application: { id: number } }>(api(baseUrl, cookie, "POST", "/api/applications", APPLICATION_INPUT), "create application");
  const drawings = await must<{ document: { id: number } }>(
    upload(baseUrl, cookie, `/api/applications/${application.id}/documents?kind=drawings`, "structural.pdf", await makeDrawingSet({ sheets: [{ number: "S-201", title: "SECOND FLOOR FRAMING PLAN" }] }), "application/pdf"),
    "upload drawings",
  );
  return { id: application.id, drawingsId: drawings.document.id };
}

/** Filed, accepted and with the examiner; the calc package and member model were uploaded while still a draft. */
async function inReview(baseUrl: string, c: AccessFixtures["cookies"], examinerId: number) {
  const app = await newApplication(baseUrl, c.owner);
  const calc = await must<{ document: { id: number } }>(
    upload(baseUrl, c.owner, `/api/applications/${app.id}/documents?kind=calculations`, "calcs.pdf", await makeCalcPackage({ pages: [["FB-3  Span L = 16'-0\"", "wD = 72 plf  wL = 240 plf", "DL = 0.21 in < L/360"]] }), "application/pdf"),
    "upload calculations",
  );
  const model = await must<{ model: { id: number } }>(upload(baseUrl, c.owner, `/api/applications/${app.id}/member-models`, "fb-3.json", JSON.stringify(FB3_MODEL), "application/json"), "upload member model");
  await must(api(baseUrl, c.owner, "POST", `/api/applications/${app.id}/events`, { event: "submit", version: await version(baseUrl, c.owner, app.id) }), "submit");
  await must(api(baseUrl, c.technician, "POST", `/api/applications/${app.id}/events`, { event: "accept", version: await version(baseUrl, c.technician, app.id), input: { examinerId } }), "accept");
  const { check } = await must<{ check: { id: number } }>(
    api(baseUrl, c.examiner, "POST", `/api/applications/${app.id}/checks`, { source: { form: "model", model: FB3_MODEL }, options: {}, purpose: "review", memberMark: "FB-3" }),
    "save check",
  );
  return { ...app, calcId: calc.document.id, modelId: model.model.id, checkId: check.id };
}

export async function buildFixtures(baseUrl: string, databaseUrl: string): Promise<AccessFixtures> {
  const conn = await mysql.createConnection({ uri: databaseUrl });
  const hash = await hashPassword(PASSWORD);
  const ids = {} as AccessFixtures["users"];
  try {
    const [fa] = await conn.query<mysql.ResultSetHeader>("INSERT INTO firms (name, kind, city) VALUES ('Corbel & Finch Structural', 'design', 'Larkspur Falls')");
    const [fb] = await conn.query<mysql.ResultSetHeader>("INSERT INTO firms (name, kind, city) VALUES ('Tamarack Builders', 'contractor', 'Larkspur Falls')");
    const people: [Exclude<AccessActor, "signed_out">, string, string, number | null][] = [
      ["owner", "applicant", "owen.corbel@corbelfinch.example", fa.insertId],
      ["other_applicant", "applicant", "tess.tamarack@tamarack.example", fb.insertId],
      ["technician", "technician", "pat.intake@larkspurfalls.example", null],
      ["examiner", "examiner", "rhea.examiner@larkspurfalls.example", null],
      ["supervisor", "supervisor", "sam.supervisor@larkspurfalls.example", null],
      ["admin", "admin", "ada.admin@larkspurfalls.example", null],
      ["deactivated", "examiner", "former.examiner@larkspurfalls.example", null],
    ];
    for (const [actor, role, email, firm] of people) {
      const [r] = await conn.query<mysql.ResultSetHeader>("INSERT INTO users (email, name, role, status, password_hash, firm_id) VALUES (?, ?, ?, 'active', ?, ?)", [email, `Test ${actor}`, role, hash, firm]);
      ids[actor] = r.insertId;
    }
  } finally {
    await conn.end();
  }
  const cookies = {} as AccessFixtures["cookies"];
  for (const actor of Object.keys(ids) as (keyof typeof ids)[]) {
    const email = { owner: "owen.corbel@corbelfinch.example", other_applicant: "tess.tamarack@tamarack.example", technician: "pat.intake@larkspurfalls.example", examiner: "rhea.examiner@larkspurfalls.example", supervisor: "sam.supervisor@larkspurfalls.example", admin: "ada.admin@larkspurfalls.example", deactivated: "former.examiner@larkspurfalls.example" }[actor];
    cookies[actor] = await signIn(baseUrl, email, PASSWORD);
  }

  const draft = await newApplication(baseUrl, cookies.owner);
  const review = await inReview(baseUrl, cookies, ids.examiner);
  const { comment } = await must<{ comment: { id: number } }>(api(baseUrl, cookies.examiner, "POST", `/api/applications/${review.id}/comments`, COMMENT), "comment");
  const spareComments: number[] = [];
  for (let i = 0; i < 2; i++) {
    const spare = await must<{ comment: { id: number } }>(api(baseUrl, cookies.examiner, "POST", `/api/applications/${review.id}/comments`, { ...COMMENT, body: `${COMMENT.body} (draft ${i + 1})` }), "spare comment");
    spareComments.push(spare.comment.id);
  }
  const invoices = await must<{ invoices: { id: number }[] }>(api(baseUrl, cookies.owner, "GET", `/api/applications/${review.id}/invoices`), "invoices");
  const invoice = invoices.invoices[0];
  if (!invoice) throw new Error(`fixture: accepting the application made no plan-review invoice (${JSON.stringify(invoices)})`);

  const corr = await inReview(baseUrl, cookies, ids.examiner);
  const fromCheck = await must<{ comment: { id: number } }>(api(baseUrl, cookies.examiner, "POST", `/api/applications/${corr.id}/checks/${corr.checkId}/comment`), "comment from check");
  await must(api(baseUrl, cookies.examiner, "POST", `/api/applications/${corr.id}/events`, { event: "issue_corrections", version: await version(baseUrl, cookies.examiner, corr.id) }), "issue corrections");

  const b = await newApplication(baseUrl, cookies.other_applicant);
  const holiday = "2031-12-26";
  await must(api(baseUrl, cookies.admin, "POST", "/api/settings/holidays", { day: holiday, name: "Founders' Day (observed)" }), "holiday");

  // Signed in while active, then deactivated the way the administrator does it: the old cookie must stop working.
  const conn2 = await mysql.createConnection({ uri: databaseUrl });
  try {
    await conn2.query("UPDATE users SET status = 'deactivated', session_version = session_version + 1, version = version + 1 WHERE id = ?", [ids.deactivated]);
  } finally {
    await conn2.end();
  }

  return {
    cookies,
    users: ids,
    a: {
      draft: { id: draft.id, version: await version(baseUrl, cookies.owner, draft.id), drawingsId: draft.drawingsId },
      review: { id: review.id, drawingsId: review.drawingsId, calcId: review.calcId, modelId: review.modelId, checkId: review.checkId, commentId: comment.id, spareComments, invoiceId: invoice.id },
      corrections: { id: corr.id, checkId: corr.checkId, commentId: fromCheck.comment.id },
    },
    b: { draftId: b.id },
    holiday,
  };
}

/** A stand-in for the demo mail receiver, so the administrator's mailbox row has something to read. */
export function mailCapture(port: number): Promise<Server> {
  const server = createServer((req, res) => {
    res.setHeader("content-type", "application/json");
    res.end(req.url === "/messages" ? "[]" : "{}");
  });
  return new Promise((resolve) => server.listen(port, "127.0.0.1", () => resolve(server)));
}
