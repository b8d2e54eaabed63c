/**
 * A protocol's texts carry marks of how firmly a statement stands ("[from memory]",
 * "[common practice; no source]", "(from memory)"). They belong on the protocol pages, where a
 * reviewer weighs them; a clinical form, a patient's sheet or a preparation instruction shows the
 * text without them.
 */
const sourceMark =
  /\s*(?:\[(?:from memory|common practice|published)[^\]]*\]|\((?:from memory|common practice)[^)]*\))/gi;

export function withoutSourceMarks(text: string): string {
  return text.replace(sourceMark, '').trim();
}

/** Finds a source mark left in a text (browser tests look for these on forms and sheets). */
export const sourceMarkPattern =
  /\[(?:from memory|common practice|published)[^\]]*\]|\((?:from memory|common practice)[^)]*\)|Source: from memory/i;
