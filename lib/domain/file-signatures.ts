// What a file is, told from its first bytes and never from its name or the type the browser claims: a renamed
// file of another kind is refused wherever files are taken (hand calculations, job attachments).
export type SniffedType = "application/pdf" | "image/png" | "image/jpeg" | "image/webp";

/** Each type's signature: byte runs at fixed offsets. */
const SIGNATURES: Record<SniffedType, { at: number; bytes: number[] }[]> = {
  "application/pdf": [{ at: 0, bytes: [0x25, 0x50, 0x44, 0x46, 0x2d] }], // %PDF-
  "image/png": [{ at: 0, bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] }],
  "image/jpeg": [{ at: 0, bytes: [0xff, 0xd8, 0xff] }],
  "image/webp": [
    { at: 0, bytes: [0x52, 0x49, 0x46, 0x46] }, // RIFF
    { at: 8, bytes: [0x57, 0x45, 0x42, 0x50] }, // WEBP
  ],
};

export const TYPE_WORDS: Record<SniffedType, string> = {
  "application/pdf": "PDF",
  "image/png": "PNG",
  "image/jpeg": "JPEG",
  "image/webp": "WebP",
};

export const TYPE_EXTENSIONS: Record<SniffedType, string> = {
  "application/pdf": "pdf",
  "image/png": "png",
  "image/jpeg": "jpg",
  "image/webp": "webp",
};

/** True when the bytes begin as a file of that type does. */
export function bytesAreOfType(body: Uint8Array, type: SniffedType): boolean {
  return SIGNATURES[type].every(({ at, bytes }) => bytes.every((byte, i) => body[at + i] === byte));
}

/**
 * A file name a download can carry: no path, no control, quote or direction-changing characters, at most 120
 * characters; `fallback` when nothing is left.
 */
export function cleanFileName(name: string, fallback: string): string {
  const base = name.split(/[\\/]/).pop() ?? "";
  const cleaned = base
    // eslint-disable-next-line no-control-regex -- control characters are exactly what is removed here
    .replace(/[\u0000-\u001f\u007f-\u009f"\u202a-\u202e\u2066-\u2069]/g, "")
    .trim()
    .slice(-120);
  return cleaned || fallback;
}

/** Content-Disposition for a download: an ASCII name for old clients and the exact name for the rest. */
export function attachmentDisposition(fileName: string): string {
  return `attachment; filename="${fileName.replace(/[^\x20-\x7e]/g, "_")}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}
