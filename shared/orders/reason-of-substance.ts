/**
 * What a clinician's reason to go on despite a caution must be: something a colleague reading the
 * signed order can act on. At least this many characters and this many different words, not the
 * question said back, and not filler such as "n/a", "ok" or "...".
 */
export const minimumSubstantialReasonChars = 15;
export const minimumSubstantialReasonWords = 3;

/** Words that carry nothing on their own; a reason made only of them is a placeholder. */
const fillerWords = new Set([
  'n',
  'a',
  'na',
  'ok',
  'okay',
  'k',
  'none',
  'nil',
  'no',
  'yes',
  'y',
  'test',
  'testing',
  'x',
  'xx',
  'xxx',
  'tbc',
  'tbd',
  'todo',
  'see',
  'notes',
  'note',
  'above',
  'below',
  'as',
  'per',
  'fine',
  'same',
  'nothing',
  'reason',
  'asdf',
  'etc',
  'dito',
  'ditto',
  'done',
  'checked',
  'noted',
  'agreed',
  'unknown',
  'whatever',
  'blah',
  'the',
  'and',
  'it',
  'is',
]);

function wordsOf(text: string): string[] {
  return text.toLowerCase().match(/[\p{L}\p{N}]+/gu) ?? [];
}

/**
 * Why a reason is not one of substance, as a sentence that says what to write instead; null when
 * it is. `question` is the question the reason answers, so that repeating it does not count.
 */
export function reasonOfSubstanceProblem(
  reason: string | null | undefined,
  question?: string,
  /** What the reason must say; a caution's reason says why treatment is still right. */
  sayWhat = 'why treatment is still right',
): string | null {
  const text = (reason ?? '').trim();
  if (text === '')
    return `give a reason (at least ${minimumSubstantialReasonChars} characters and ${minimumSubstantialReasonWords} words) saying ${sayWhat}`;
  const words = wordsOf(text);
  const distinct = new Set(words);
  if (
    text.length < minimumSubstantialReasonChars ||
    distinct.size < minimumSubstantialReasonWords
  ) {
    return `the reason must be at least ${minimumSubstantialReasonChars} characters and ${minimumSubstantialReasonWords} different words, saying ${sayWhat} (got "${text}")`;
  }
  if ([...distinct].every((word) => fillerWords.has(word))) {
    return `"${text}" is a placeholder, not a reason: say ${sayWhat}`;
  }
  if (question !== undefined) {
    const asked = new Set(wordsOf(question));
    if ([...distinct].every((word) => asked.has(word))) {
      return `the reason only repeats the question: say ${sayWhat} (what was weighed, who agreed, what is done about it)`;
    }
  }
  return null;
}
