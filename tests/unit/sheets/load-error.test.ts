import { describe, expect, it } from "vitest";
import { InvalidPDFException, PasswordException, RenderingCancelledException, ResponseException } from "pdfjs-dist/legacy/build/pdf.mjs";
import { describeLoadError, isRenderCancelled } from "@/components/sheets/load-error";

// The errors are pdf.js's own (pdfjs-dist 6.5 legacy build), so a renamed class upstream fails here.
describe("why a sheet cannot be shown", () => {
  it("says a password-protected PDF is password-protected", () => {
    expect(describeLoadError(new PasswordException("No password given", 1))).toMatch(/password/i);
  });

  it("says a broken file is not a readable PDF", () => {
    expect(describeLoadError(new InvalidPDFException("Invalid PDF structure."))).toMatch(/not a readable PDF/);
  });

  it("tells 'not found' (RFC 9110 §15.5.5) from 'forbidden' (§15.5.4) and names other statuses", () => {
    const notFound = describeLoadError(new ResponseException("Missing", 404, true));
    const forbidden = describeLoadError(new ResponseException("Forbidden", 403, false));
    expect(notFound).toMatch(/could not be found/);
    expect(forbidden).toMatch(/sign in/i);
    expect(notFound).not.toBe(forbidden);
    expect(describeLoadError(new ResponseException("Bad gateway", 502, false))).toContain("502");
  });

  it("has a plain fallback for anything else", () => {
    expect(describeLoadError(new Error("boom"))).toBe(describeLoadError(null));
  });

  it("treats a cancelled render as no failure", () => {
    expect(isRenderCancelled(new RenderingCancelledException("Rendering cancelled, page 1"))).toBe(true);
    expect(isRenderCancelled(new InvalidPDFException("x"))).toBe(false);
    expect(isRenderCancelled(undefined)).toBe(false);
  });
});
