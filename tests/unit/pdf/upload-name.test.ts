import { describe, expect, it } from "vitest";
import { checkUploadName, MAX_UPLOAD_NAME_LENGTH, UPLOAD_NAME_MESSAGES, type UploadNameCode } from "@/lib/pdf/upload-name";

describe("checkUploadName", () => {
  it.each([
    ["Riverbend-Commons S-101.pdf", "Riverbend-Commons S-101.pdf"],
    ["  FOUNDATION   PLAN.PDF ", "FOUNDATION PLAN.PDF"],
    ["Calcs%20Rev%202.pdf", "Calcs Rev 2.pdf"],
    ["plans.exe.pdf", "plans.exe.pdf"],
    // NFC (Unicode UAX #15): "e" + U+0301 COMBINING ACUTE becomes U+00E9.
    ["Fe\u0301vrier.pdf", "F\u00e9vrier.pdf"],
    ["Tamarack Builders – Résumé.pdf", "Tamarack Builders – Résumé.pdf"],
  ])("accepts %j as %j", (name, displayName) => {
    expect(checkUploadName(name)).toEqual({ ok: true, displayName });
  });

  it.each<[string, string, UploadNameCode]>([
    ["empty", "", "name_empty"],
    ["only spaces", "   ", "name_empty"],
    ["a folder path", "sets/S-101.pdf", "name_path"],
    ["a Windows path", "C:\\plans\\S-101.pdf", "name_path"],
    ["a traversal, percent-encoded", "..%2F..%2Fetc%2Fpasswd.pdf", "name_path"],
    ["a traversal, encoded twice", "..%252F..%252Fx.pdf", "name_path"],
    ["a NUL byte", "S-101.pdf\u0000.exe", "name_control_characters"],
    ["a NUL byte, percent-encoded", "S-101.pdf%00.exe", "name_control_characters"],
    ["a newline (header injection)", "S-101\r\nX-Evil: 1.pdf", "name_control_characters"],
    // U+202E RIGHT-TO-LEFT OVERRIDE shows "plan\u202Efdp.exe" as "planexe.pdf" (Unicode UAX #9).
    ["a bidi override", "plan\u202Efdp.exe", "name_control_characters"],
    ["another extension", "S-101.png", "name_not_pdf"],
    ["no extension", "S-101", "name_not_pdf"],
    ["only the extension", ".pdf", "name_not_pdf"],
    ["dots and the extension", "...pdf", "name_not_pdf"],
    ["an extension hidden by encoding", "S-101.pdf%2Ehtml", "name_not_pdf"],
    ["too long", `${"a".repeat(MAX_UPLOAD_NAME_LENGTH - 3)}.pdf`, "name_too_long"],
  ])("refuses %s", (_label, name, code) => {
    expect(checkUploadName(name)).toEqual({ ok: false, code, message: UPLOAD_NAME_MESSAGES[code] });
  });

  it("counts characters, not UTF-16 units, against the cap", () => {
    // U+1F3D7 BUILDING CONSTRUCTION is one character, two UTF-16 code units.
    const name = `${"\u{1F3D7}".repeat(MAX_UPLOAD_NAME_LENGTH - 4)}.pdf`;
    expect(name.length).toBeGreaterThan(MAX_UPLOAD_NAME_LENGTH);
    expect(checkUploadName(name).ok).toBe(true);
  });

  it("leaves a malformed percent sequence as typed", () => {
    expect(checkUploadName("100% complete.pdf")).toEqual({ ok: true, displayName: "100% complete.pdf" });
  });

  it("has one distinct message per code", () => {
    const messages = Object.values(UPLOAD_NAME_MESSAGES);
    expect(new Set(messages).size).toBe(messages.length);
  });
});
