import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { flattenJson } from '../../shared/protocol/diff-versions';
import {
  describeProtocolPath,
  formatProtocolValue,
} from '../../src/features/protocols/components/protocol-field-labels';

// The compare screen names every value with the version page's labels, never a JSON path.

const protocolsDir = path.resolve(import.meta.dirname, '../../protocols');

describe('the protocol field label table', () => {
  it('names every field of every shipped version (the approval block is listed apart)', () => {
    const unnamed = new Set<string>();
    for (const file of readdirSync(protocolsDir)) {
      const definition = JSON.parse(readFileSync(path.join(protocolsDir, file), 'utf8'));
      for (const leaf of flattenJson(definition).keys()) {
        if (leaf.startsWith('approval')) continue;
        if (describeProtocolPath(leaf).section === 'Other') unnamed.add(leaf);
      }
    }
    expect([...unnamed]).toEqual([]);
  });

  it('words paths as the version page does, with the unit in the label', () => {
    expect(describeProtocolPath('light.exposureS')).toEqual({
      section: 'Light',
      label: 'Light-on time (s)',
      shown: 'duration',
    });
    expect(describeProtocolPath('steps[2].durationS').label).toBe('Step 3: Duration (s)');
    expect(describeProtocolPath('cautions[0]').label).toBe('Caution 1');
    expect(describeProtocolPath('inputLimits.heightCm.soft.min').label).toBe(
      'Height (cm), soft range, lowest',
    );
    expect(describeProtocolPath('drug.someFieldAddedLater')).toEqual({
      section: 'Other',
      label: 'someFieldAddedLater',
    });
  });

  it('writes values as the version page does', () => {
    // Source: TAP Study Group, Arch Ophthalmol 1999 — 83 s of light.
    expect(formatProtocolValue(83, 'duration')).toBe('83 s (1 min 23 s)');
    expect(formatProtocolValue(0.1)).toBe('0.1');
    expect(formatProtocolValue(null)).toBe('Not used in this protocol');
    expect(formatProtocolValue(true, 'yes-no')).toBe('Yes');
  });
});
