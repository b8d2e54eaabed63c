/**
 * A protocol's texts carry marks of how firmly a statement stands ("[from memory]",
 * "[common practice; no source]"). They belong on the protocol pages, where a reviewer weighs
 * them; a clinical form, a patient's sheet or a preparation instruction shows the text without.
 */
const sourceMark = /\s*\[(?:from memory|common practice|published)[^\]]*\]/gi;

export function withoutSourceMarks(text: string): string {
  return text.replace(sourceMark, '').trim();
}

/** True when a text still carries a source mark (browser tests look for these on every screen). */
export const sourceMarkPattern =
  /\[(?:from memory|common practice|published)[^\]]*\]|Source: from memory/i;
