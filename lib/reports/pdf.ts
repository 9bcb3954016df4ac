import "server-only";
/**
 * The one place Tareline makes PDFs with pdfmake (0.3, server side): the fonts shipped
 * with the app (lib/reports/fonts, Geist, SIL OFL), no URL ever fetched
 * (`setUrlAccessPolicy(() => false)`), and a local access policy that lets pdfmake read
 * exactly those font files and nothing else. Every sheet (prep sheet, analysis report)
 * renders through `renderPdf`.
 */
import path from "node:path";
import pdfmake from "pdfmake";
import type { TDocumentDefinitions, TFontDictionary } from "pdfmake/interfaces";

/** The folder of the shipped fonts (the app runs from the project root, as `next start` and the tests do). */
export const FONT_DIR = path.join(process.cwd(), "lib", "reports", "fonts");

const file = (name: string) => path.join(FONT_DIR, name);

/** The font families the sheets use: "Sans" (Geist) and "Mono" (Geist Mono, for hashes). */
export const PDF_FONTS: TFontDictionary = {
  Sans: {
    normal: file("Geist-Regular.ttf"),
    bold: file("Geist-SemiBold.ttf"),
    italics: file("Geist-Italic.ttf"),
    bolditalics: file("Geist-SemiBoldItalic.ttf"),
  },
  Mono: {
    normal: file("GeistMono-Regular.ttf"),
    bold: file("GeistMono-Regular.ttf"),
    italics: file("GeistMono-Regular.ttf"),
    bolditalics: file("GeistMono-Regular.ttf"),
  },
};

const ALLOWED_FILES = new Set(Object.values(PDF_FONTS).flatMap((f) => [f.normal, f.bold, f.italics, f.bolditalics].map((p) => path.resolve(String(p)))));

/** Whether pdfmake may read a local file: exactly the shipped font files. */
export function mayReadLocalFile(p: string): boolean {
  return ALLOWED_FILES.has(path.resolve(p));
}

function configure(): void {
  pdfmake.setFonts(PDF_FONTS);
  pdfmake.setUrlAccessPolicy(() => false);
  pdfmake.setLocalAccessPolicy(mayReadLocalFile);
}

/**
 * Renders a pdfmake document definition to a PDF (default font "Sans"). The shipped
 * Sans files have tabular digits by default (lib/reports/fonts/README.md), so no
 * OpenType feature is requested: a feature request turns off pdfkit's layout cache.
 */
export async function renderPdf(doc: TDocumentDefinitions): Promise<Buffer> {
  configure();
  const definition: TDocumentDefinitions = {
    ...doc,
    defaultStyle: { font: "Sans", fontSize: 9, ...doc.defaultStyle },
  };
  const out = await pdfmake.createPdf(definition).getBuffer();
  return Buffer.from(out);
}
