// Copies the pdf.js worker into public/ so the browser loads it from our own origin (the CSP
// allows workers from 'self' only). Runs before `next dev` and `next build`; the copy is
// git-ignored and always matches the installed pdfjs-dist.
import { copyFileSync, mkdirSync, readFileSync, statSync } from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";

const root = path.resolve(import.meta.dirname, "..");
const require = createRequire(import.meta.url);
const pkgDir = path.dirname(require.resolve("pdfjs-dist/package.json", { paths: [root] }));
const source = path.join(pkgDir, "build", "pdf.worker.min.mjs");
const target = path.join(root, "public", "pdf.worker.min.mjs");

function same(a, b) {
  try {
    if (statSync(a).size !== statSync(b).size) return false;
    return readFileSync(a).equals(readFileSync(b));
  } catch {
    return false;
  }
}

const { version } = JSON.parse(readFileSync(path.join(pkgDir, "package.json"), "utf8"));
if (same(source, target)) {
  console.log(`pdf.js worker ${version} already in public/`);
} else {
  mkdirSync(path.dirname(target), { recursive: true });
  copyFileSync(source, target);
  console.log(`pdf.js worker ${version} copied to public/pdf.worker.min.mjs`);
}
