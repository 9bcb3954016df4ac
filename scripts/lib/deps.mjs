// Installs npm dependencies when they are missing or older than the lock file,
// and Debian packages (postgresql, chromium) when their binaries are missing.
import { existsSync, statSync, readdirSync } from "node:fs";
import { run } from "./run.mjs";
import { step } from "./log.mjs";

export function ensureNodeModules(root) {
  const marker = `${root}/node_modules/.package-lock.json`;
  const lock = `${root}/package-lock.json`;
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) {
    step("npm dependencies: already installed");
    return;
  }
  step("npm dependencies: installing with `npm ci` (about a minute on a fresh machine)…");
  run("npm", ["ci", "--no-audit", "--no-fund"], { cwd: root });
}

let aptUpdated = false;
export function aptInstall(pkg, why) {
  const isRoot = process.getuid?.() === 0;
  if (!isRoot) {
    throw new Error(`${why} is missing. Install Debian's "${pkg}" package (sudo apt-get install -y ${pkg}) and run again.`);
  }
  if (!aptUpdated) {
    step("apt-get update…");
    run("apt-get", ["update", "-qq"]);
    aptUpdated = true;
  }
  step(`apt-get install ${pkg} (${why})…`);
  run("apt-get", ["install", "-y", "-qq", pkg], { env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
}

/** The newest /usr/lib/postgresql/N/bin, installing Debian's postgresql when none exists. */
export function ensurePostgresBinaries() {
  const find = () => {
    const base = "/usr/lib/postgresql";
    if (!existsSync(base)) return null;
    const versions = readdirSync(base).filter((v) => existsSync(`${base}/${v}/bin/initdb`)).sort((a, b) => Number(b) - Number(a));
    return versions[0] ? `${base}/${versions[0]}/bin` : null;
  };
  let bin = find();
  if (!bin) {
    aptInstall("postgresql", "the PostgreSQL server");
    bin = find();
    if (!bin) throw new Error("PostgreSQL was installed but no initdb was found under /usr/lib/postgresql.");
  }
  return bin;
}

export function ensureChromium() {
  if (existsSync("/usr/bin/chromium")) return "/usr/bin/chromium";
  aptInstall("chromium", "Chromium for the browser tests");
  if (!existsSync("/usr/bin/chromium")) throw new Error("chromium was installed but /usr/bin/chromium is missing.");
  return "/usr/bin/chromium";
}

/** pdftotext and pdftoppm (Debian's poppler-utils): the report tests read and render the PDFs with them. */
export function ensurePoppler() {
  if (existsSync("/usr/bin/pdftotext") && existsSync("/usr/bin/pdftoppm")) return "/usr/bin/pdftotext";
  aptInstall("poppler-utils", "pdftotext and pdftoppm for the PDF report tests");
  if (!existsSync("/usr/bin/pdftotext")) throw new Error("poppler-utils was installed but /usr/bin/pdftotext is missing.");
  return "/usr/bin/pdftotext";
}
