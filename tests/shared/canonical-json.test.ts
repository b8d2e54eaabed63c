import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../shared/protocol/canonical-json';
import { readProtocolJson } from './support/shipped-protocols';

describe('canonical JSON', () => {
  it('sorts keys at every depth and writes no whitespace', () => {
    const text = canonicalJson({ b: 1, a: { d: [3, { z: true, y: null }], c: 'x' } });

    expect(text).toBe('{"a":{"c":"x","d":[3,{"y":null,"z":true}]},"b":1}');
  });

  it('gives the same text, and so the same SHA-256, whatever the key order or layout', () => {
    const protocol = readProtocolJson('pdt-standard.v1.json') as Record<string, unknown>;
    const reordered = Object.fromEntries(Object.entries(protocol).reverse());

    const hash = (value: unknown) =>
      createHash('sha256').update(canonicalJson(value)).digest('hex');

    expect(hash(reordered)).toBe(hash(protocol));
    expect(JSON.parse(canonicalJson(protocol))).toEqual(protocol);
  });

  it('changes when any value changes', () => {
    const protocol = readProtocolJson('pdt-standard.v1.json') as { light: { exposureS: number } };
    const changed = structuredClone(protocol);
    changed.light.exposureS = 84;

    expect(canonicalJson(changed)).not.toBe(canonicalJson(protocol));
  });

  it('leaves out undefined properties, as JSON does, and keeps strings escaped', () => {
    expect(canonicalJson({ a: undefined, b: 'line\n"quoted"', c: 'µm' })).toBe(
      '{"b":"line\\n\\"quoted\\"","c":"µm"}',
    );
  });

  it.each([
    ['a non-finite number', { a: Number.NaN }, /\$\.a is NaN/],
    ['a date', { a: new Date(0) }, /\$\.a is not a plain object/],
    ['undefined in an array', [1, undefined], /\$\[1\] is undefined/],
    ['a function', { f: () => 1 }, /\$\.f is function/],
  ])('refuses %s rather than guess', (_label, value, message) => {
    expect(() => canonicalJson(value)).toThrow(message);
  });
});
