/**
 * Safety-data-sheet uploads: PDF only, checked by content (the "%PDF-" signature of
 * ISO 32000-1 §7.5.2, not the file name or the browser's type) and by size.
 */
export const SDS_MAX_BYTES = 10 * 1024 * 1024;

/** Why `bytes` is not an acceptable safety data sheet, or null when it is. */
export function sdsProblem(bytes: Uint8Array): string | null {
  if (bytes.length === 0) return "the file is empty";
  if (bytes.length > SDS_MAX_BYTES) return `the file has ${bytes.length} bytes; at most 10 MB (${SDS_MAX_BYTES} bytes)`;
  const head = String.fromCharCode(...bytes.subarray(0, 5));
  if (head !== "%PDF-") return "the file is not a PDF (it does not start with %PDF-)";
  return null;
}
