import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { supportsInPlainWords } from '../../src/features/protocols/components/protocol-field-labels';

describe('what a source supports, in the version page’s words', () => {
  it('names fields by their labels, leaves plain words and units alone', () => {
    expect(supportsInPlainWords('drug.lightPrecautionH (48 h chosen for the demo)')).toBe(
      'Light precautions after the infusion (h) (48 h chosen for the demo)',
    );
    expect(supportsInPlainWords('bsaFormulaDefault (Mosteller)')).toBe(
      'Default BSA formula (Mosteller)',
    );
    expect(supportsInPlainWords('strength 2 mg/mL after reconstitution; 600 mW/cm²')).toBe(
      'strength 2 mg/mL after reconstitution; 600 mW/cm²',
    );
  });

  it('leaves no field name of a shipped protocol file in a source’s text', () => {
    const dir = path.resolve(__dirname, '../../protocols');
    const left: string[] = [];
    for (const file of readdirSync(dir).filter((f) => f.endsWith('.json'))) {
      const { sources } = JSON.parse(readFileSync(path.join(dir, file), 'utf8')) as {
        sources: { supports: string }[];
      };
      for (const { supports } of sources) {
        const shown = supportsInPlainWords(supports);
        const raw = /(?<![\w-])(?!mW\b|mL\b)([a-z]+[A-Z][A-Za-z]*|[a-z]+\.[a-z][A-Za-z]*)\b/.exec(
          shown,
        );
        if (raw) left.push(`${file}: ${raw[0]} in «${shown}»`);
      }
    }
    expect(left).toEqual([]);
  });
});
