/** The report types a unit attaches, recognised by their first bytes (their "magic numbers"). */
const signatures: { mimeType: string; extension: string; bytes: number[] }[] = [
  { mimeType: 'application/pdf', extension: 'pdf', bytes: [0x25, 0x50, 0x44, 0x46, 0x2d] }, // %PDF-
  {
    mimeType: 'image/png',
    extension: 'png',
    bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a],
  },
  { mimeType: 'image/jpeg', extension: 'jpg', bytes: [0xff, 0xd8, 0xff] },
];

/** The extension for a type this module recognises; anything else downloads as opaque bytes. */
export function extensionOf(mimeType: string): string {
  return signatures.find((s) => s.mimeType === mimeType)?.extension ?? 'bin';
}

export function detectFileType(content: Buffer): { mimeType: string; extension: string } | null {
  const match = signatures.find((s) => s.bytes.every((b, i) => content[i] === b));
  return match ? { mimeType: match.mimeType, extension: match.extension } : null;
}
