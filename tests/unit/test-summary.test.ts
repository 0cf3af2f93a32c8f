import { describe, expect, it } from "vitest";
import { playwrightFailures, vitestFailures } from "@/scripts/test-summary";

// Shapes as vitest 4 and Playwright 1.65 write their JSON reports (checked by hand against both).
describe("test summary at the end of the test command", () => {
  it("names each failed vitest test with its first error line, and a file that failed outside its tests", () => {
    const lines = vitestFailures(
      {
        testResults: [
          {
            name: "/repo/tests/unit/a.test.ts",
            status: "failed",
            assertionResults: [
              { fullName: "outer fails here", status: "failed", failureMessages: ["\u001b[31mAssertionError: expected 1 to be 2\u001b[39m\n    at a.test.ts:2"] },
              { fullName: "outer passes", status: "passed", failureMessages: [] },
            ],
          },
          { name: "/repo/tests/unit/b.test.ts", status: "failed", message: "Cannot find module './gone'", assertionResults: [] },
          { name: "/repo/tests/unit/c.test.ts", status: "passed", assertionResults: [{ fullName: "ok", status: "passed", failureMessages: [] }] },
        ],
      },
      "/repo",
    );
    expect(lines).toEqual(["tests/unit/a.test.ts > outer fails here: AssertionError: expected 1 to be 2", "tests/unit/b.test.ts: Cannot find module './gone'"]);
  });

  it("names failed and timed-out Playwright tests through nested describes, not skipped or passed ones", () => {
    const result = (status: string, message?: string) => ({ tests: [{ results: [{ status, ...(message ? { error: { message } } : {}) }] }] });
    const lines = playwrightFailures([
      {
        title: "journey.spec.ts",
        file: "journey.spec.ts",
        specs: [{ title: "top", ...result("timedOut", "Test timeout of 60000ms exceeded.") }],
        suites: [{ title: "intake", file: "journey.spec.ts", specs: [{ title: "returns", ...result("failed", "Error: expect(locator).toBeVisible()\nmore") }, { title: "later", ...result("skipped") }, { title: "fine", ...result("passed") }] }],
      },
    ]);
    expect(lines).toEqual(["journey.spec.ts > top: Test timeout of 60000ms exceeded.", "journey.spec.ts > intake > returns: Error: expect(locator).toBeVisible()"]);
  });
});
