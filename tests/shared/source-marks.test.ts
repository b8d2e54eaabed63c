import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { sourceMarkPattern, withoutSourceMarks } from '../../shared/protocol/source-marks';

// Source marks stay on the protocol pages; clinical forms, sheets and instructions show the text without them.

describe('source marks', () => {
  it('are taken out of a text, and nothing else is', () => {
    expect(
      withoutSourceMarks(
        '5% dextrose (glucose); not sodium chloride 0.9%, in which the drug precipitates [from memory]',
      ),
    ).toBe('5% dextrose (glucose); not sodium chloride 0.9%, in which the drug precipitates');
    expect(withoutSourceMarks('Soak 30 min [from memory / common practice]')).toBe('Soak 30 min');
    expect(withoutSourceMarks('A [common practice; no source] figure')).toBe('A figure');
    expect(
      withoutSourceMarks('Keep the spot edge at least 200 µm from the optic disc (from memory).'),
    ).toBe('Keep the spot edge at least 200 µm from the optic disc.');
    expect(withoutSourceMarks('Riboflavin 0.1% [isotonic]')).toBe('Riboflavin 0.1% [isotonic]');
    expect(withoutSourceMarks('Drops (every 2 min)')).toBe('Drops (every 2 min)');
  });

  it('no text of a shipped version that reaches a form or a preparation keeps one once cleaned', () => {
    const dir = path.resolve(import.meta.dirname, '../../protocols');
    for (const file of readdirSync(dir)) {
      const definition = JSON.parse(readFileSync(path.join(dir, file), 'utf8'));
      const texts = [
        definition.drug?.diluent,
        definition.drug?.reconstitutionFluid,
        definition.cxl?.riboflavin,
        ...definition.contraindications.map((c: { question: string }) => c.question),
        ...definition.cautions,
        ...definition.steps.map((s: { title: string }) => s.title),
      ].filter((t): t is string => typeof t === 'string');
      for (const text of texts) expect(withoutSourceMarks(text)).not.toMatch(sourceMarkPattern);
    }
  });
});
