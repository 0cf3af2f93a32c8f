import { defineConfig, devices } from "@playwright/test";

const port = Number(process.env.TEST_APP_PORT ?? 3100);
const baseURL = `http://127.0.0.1:${port}`;
const smtp = process.env.TEST_SMTP_PORT ?? "2625";
const mailHttp = process.env.TEST_MAIL_HTTP_PORT ?? "2680";
const workerHealth = process.env.TEST_WORKER_PORT ?? "2681";
// The local fake of the payment provider (scripts/fake-payments.ts); the app's SDK points at it.
const payments = process.env.TEST_PAYMENTS_PORT ?? "2690";

// Debian's chromium, never a downloaded browser. The network is closed: keep it quiet.
const chromiumArgs = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-dev-shm-usage",
];

export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  // scripts/test.sh also asks for a JSON report, from which it names the failures at the very end.
  reporter: process.env.PLAYWRIGHT_REPORT_JSON ? [["list"], ["json", { outputFile: process.env.PLAYWRIGHT_REPORT_JSON }]] : [["list"]],
  use: {
    baseURL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: { executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: chromiumArgs },
  },
  projects: [{ name: "chromium", use: { ...devices["Desktop Chrome"], channel: undefined } }],
  webServer: [
    {
      command: `node_modules/.bin/tsx scripts/mail-receiver.ts`,
      env: { SMTP_PORT: smtp, MAIL_HTTP_PORT: mailHttp, MAIL_FILE: ".data/test-mail/messages.jsonl" },
      url: `http://127.0.0.1:${mailHttp}/messages`,
      reuseExistingServer: false,
      timeout: 30_000,
    },
    {
      command: `node_modules/.bin/tsx --conditions=react-server scripts/worker.ts`,
      env: { WORKER_INTERVAL_MS: "300", WORKER_HEALTH_PORT: workerHealth },
      url: `http://127.0.0.1:${workerHealth}/`,
      reuseExistingServer: false,
      timeout: 30_000,
    },
    {
      command: `node_modules/.bin/tsx scripts/fake-payments.ts`,
      env: { PAYMENTS_PORT: payments, PAYMENTS_WEBHOOK_URL: `${baseURL}/api/payments/webhook` },
      url: `http://127.0.0.1:${payments}/_fake/health`,
      reuseExistingServer: false,
      timeout: 30_000,
    },
    {
      command: `node node_modules/next/dist/bin/next start --hostname 127.0.0.1 --port ${port}`,
      // This test department requires the plan-review fee before review starts.
      env: { PAYMENTS_API_URL: `http://127.0.0.1:${payments}`, PAYMENT_REQUIRED_BEFORE_REVIEW: process.env.PAYMENT_REQUIRED_BEFORE_REVIEW ?? "true" },
      url: `${baseURL}/sign-in`,
      reuseExistingServer: false,
      timeout: 90_000,
    },
  ],
});
