/**
 * Reading the PDFs the way a person's tools would: Debian's poppler-utils (`pdftotext`,
 * `pdfinfo`, `pdftoppm`), which `node scripts/test.mjs unit` installs when missing
 * (scripts/lib/deps.mjs `ensurePoppler`). Page images are kept under
 * test-results/reports/ as artifacts to look at.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("../../../", import.meta.url));
export const ARTIFACTS = join(root, "test-results", "reports");

function tool(name: string): string {
  const p = `/usr/bin/${name}`;
  if (!existsSync(p)) throw new Error(`${p} is missing: install Debian's poppler-utils (node scripts/test.mjs unit does it as root).`);
  return p;
}

function withFile<T>(pdf: Buffer, fn: (file: string) => T): T {
  const dir = mkdtempSync(join(tmpdir(), "tareline-pdf-"));
  try {
    const file = join(dir, "sheet.pdf");
    writeFileSync(file, pdf);
    return fn(file);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The text of a PDF in reading layout (`pdftotext -layout`). */
export function pdfText(pdf: Buffer): string {
  return withFile(pdf, (f) => execFileSync(tool("pdftotext"), ["-layout", "-enc", "UTF-8", f, "-"], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 }));
}

/** The page count as `pdfinfo` reads it. */
export function pdfPageCount(pdf: Buffer): number {
  const info = withFile(pdf, (f) => execFileSync(tool("pdfinfo"), [f], { encoding: "utf8" }));
  const m = /^Pages:\s+(\d+)/m.exec(info);
  if (!m) throw new Error(`pdfinfo gave no page count:\n${info}`);
  return Number(m[1]);
}

/** Renders page `page` to a PNG under test-results/reports/<name>.png and returns its bytes. */
export function pdfPagePng(pdf: Buffer, name: string, page = 1, dpi = 110): Buffer {
  mkdirSync(ARTIFACTS, { recursive: true });
  const prefix = join(ARTIFACTS, name);
  withFile(pdf, (f) => execFileSync(tool("pdftoppm"), ["-f", String(page), "-l", String(page), "-r", String(dpi), "-png", "-singlefile", f, prefix]));
  return readFileSync(`${prefix}.png`);
}

/** Whitespace collapsed to single spaces (pdftotext breaks lines where the sheet wraps them). */
export function flat(text: string): string {
  return text.replace(/\s+/g, " ");
}

export function escapeRegExp(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
}
