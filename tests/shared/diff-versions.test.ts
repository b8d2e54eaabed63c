import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  compareJson,
  compareProtocolVersions,
  diffProtocolVersions,
  flattenJson,
} from '../../shared/protocol/diff-versions';
import { copyOf, loadProtocol } from './support/shipped-protocols';

describe('flattening a definition to JSON paths', () => {
  it('names object members with dots and array items by index', () => {
    const leaves = flattenJson({
      light: { irradianceMwPerCm2: 600, pulse: null },
      steps: [{ id: 'a' }, { id: 'b', durationS: 83 }],
    });

    expect([...leaves.entries()]).toEqual([
      ['light.irradianceMwPerCm2', 600],
      ['light.pulse', null],
      ['steps[0].id', 'a'],
      ['steps[1].id', 'b'],
      ['steps[1].durationS', 83],
    ]);
  });

  it('keeps empty arrays and objects as values, so they are never lost', () => {
    expect([...flattenJson({ contraindications: [], extra: {} }).entries()]).toEqual([
      ['contraindications', []],
      ['extra', {}],
    ]);
  });

  it('quotes keys a dot path cannot carry, so two different keys never share a path', () => {
    const leaves = flattenJson({ 'a.b': 1, a: { b: 2 }, '': 3 });

    expect([...leaves.keys()]).toEqual(['["a.b"]', 'a.b', '[""]']);
  });

  it('leaves out undefined members as JSON does, and refuses what JSON cannot carry', () => {
    expect([...flattenJson({ a: undefined, b: 1 }).keys()]).toEqual(['b']);
    expect(() => flattenJson({ a: Number.NaN })).toThrow(/a is NaN/);
    expect(() => flattenJson({ when: new Date(0) })).toThrow(/when is not a plain object/);
    expect(() => flattenJson([1, undefined])).toThrow(/\[1\] is undefined/);
  });

  it('gives a scalar at the top the path $', () => {
    expect([...flattenJson(7).entries()]).toEqual([['$', 7]]);
  });
});

describe('the difference between two protocol versions', () => {
  it('finds nothing between a version and an identical copy', () => {
    const standard = loadProtocol('pdt-standard');

    expect(diffProtocolVersions(standard, copyOf(standard))).toEqual([]);
  });

  it('reports a changed exposure with its value before and after', () => {
    // 83 s at 600 mW/cm² for 50 J/cm² (TAP Study Group, Arch Ophthalmol 1999); 84 s is an invented edit.
    const before = loadProtocol('pdt-standard');
    const after = copyOf(before);
    after.light.exposureS = 84;

    expect(diffProtocolVersions(before, after)).toEqual([
      { path: 'light.exposureS', before: 83, after: 84, change: 'changed' },
    ]);
  });

  it('counts a change of wording as a change, and a number turned into text as a change', () => {
    const before = loadProtocol('pdt-standard');
    const after = copyOf(before) as unknown as Record<string, unknown> & {
      cautions: string[];
      retreatmentMinDays: unknown;
    };
    after.cautions[0] = `${before.cautions[0]} Check the eyewear rating.`;
    after.retreatmentMinDays = '84';

    const paths = diffProtocolVersions(before, after as never).map((d) => [d.path, d.change]);

    expect(paths).toEqual([
      ['retreatmentMinDays', 'changed'],
      ['cautions[0]', 'changed'],
    ]);
  });

  it('compares steps by index: a step added at the end is added, a step taken out of the middle shifts the rest', () => {
    const before = loadProtocol('pdt-standard');
    const appended = copyOf(before);
    appended.steps.push({
      id: 'review',
      kind: 'aftercare',
      title: 'Review the next day',
      durationS: null,
    });

    const added = diffProtocolVersions(before, appended);
    expect(added.every((d) => d.change === 'added' && d.path.startsWith('steps[5].'))).toBe(true);
    expect(added.map((d) => d.path)).toEqual([
      'steps[5].id',
      'steps[5].kind',
      'steps[5].title',
      'steps[5].durationS',
    ]);

    const shortened = copyOf(before);
    shortened.steps.splice(2, 1); // remove the wait step
    const differences = diffProtocolVersions(before, shortened);
    expect(differences).toContainEqual({
      path: 'steps[2].id',
      before: 'wait-for-light',
      after: 'laser',
      change: 'changed',
    });
    expect(differences).toContainEqual({
      path: 'steps[4].id',
      before: 'aftercare',
      after: undefined,
      change: 'removed',
    });
  });

  it('shows an object replacing null as the null removed and each new member added', () => {
    const before = loadProtocol('cxl-accelerated');
    const after = loadProtocol('cxl-accelerated-pulsed');
    // The pulsed file has a pulse object where the continuous one has null (both shipped demo files).
    expect(before.light.pulse).toBeNull();
    expect(after.light.pulse).not.toBeNull();

    const pulse = diffProtocolVersions(before, after).filter((d) =>
      d.path.startsWith('light.pulse'),
    );

    expect(pulse).toEqual([
      { path: 'light.pulse', before: null, after: undefined, change: 'removed' },
      {
        path: 'light.pulse.onS',
        before: undefined,
        after: after.light.pulse?.onS,
        change: 'added',
      },
      {
        path: 'light.pulse.offS',
        before: undefined,
        after: after.light.pulse?.offS,
        change: 'added',
      },
    ]);
  });

  it('ignores nothing: the approval block and sources count too', () => {
    const before = loadProtocol('pdt-standard');
    const after = copyOf(before);
    after.approval = null;
    after.sources[0]!.status = 'memory';

    const paths = diffProtocolVersions(before, after).map((d) => d.path);

    expect(paths).toContain('approval');
    expect(paths).toContain('approval.approvedBy[0]');
    expect(paths).toContain('approval.note');
    expect(paths).toContain('sources[0].status');
  });

  it('is not fooled by key order: the same values in another order are no difference', () => {
    const before = loadProtocol('pdt-standard');
    const reordered = Object.fromEntries(Object.entries(before).reverse()) as typeof before;

    expect(diffProtocolVersions(before, reordered)).toEqual([]);
  });

  it('lists every path for the "show all" view, unchanged ones marked, in reading order', () => {
    const before = loadProtocol('pdt-standard');
    const after = copyOf(before);
    after.light.exposureS = 84;

    const rows = compareProtocolVersions(before, after);

    expect(rows.length).toBe(flattenJson(before).size);
    expect(rows.slice(0, 3).map((r) => [r.path, r.change])).toEqual([
      ['key', 'unchanged'],
      ['version', 'unchanged'],
      ['title', 'unchanged'],
    ]);
    expect(rows.filter((r) => r.change !== 'unchanged')).toEqual(
      diffProtocolVersions(before, after),
    );
  });

  it('places a path found only in the earlier version where it stood', () => {
    const rows = compareJson({ a: 1, gone: 2, c: 3 }, { a: 1, c: 3, fresh: 4 });

    expect(rows.map((r) => `${r.path}:${r.change}`)).toEqual([
      'a:unchanged',
      'gone:removed',
      'c:unchanged',
      'fresh:added',
    ]);
    expect(
      compareJson({ a: 1, old: 2 }, { a: 1, new: 3 }).map((r) => `${r.path}:${r.change}`),
    ).toEqual(['a:unchanged', 'old:removed', 'new:added']);
  });

  it('tells an empty array from an empty object and from a missing value', () => {
    expect(compareJson({ x: [] }, { x: {} })).toEqual([
      { path: 'x', before: [], after: {}, change: 'changed' },
    ]);
    expect(compareJson({ x: [] }, { x: [] })).toEqual([
      { path: 'x', before: [], after: [], change: 'unchanged' },
    ]);
    expect(compareJson({ x: null }, {})).toEqual([
      { path: 'x', before: null, after: undefined, change: 'removed' },
      { path: '$', before: undefined, after: {}, change: 'added' },
    ]);
  });

  it('for any two JSON documents, applying the reported changes to the first gives the second', () => {
    const json = fc.jsonValue({ maxDepth: 3 });
    fc.assert(
      fc.property(json, json, (a, b) => {
        const rows = compareJson(a, b);
        const rebuilt = new Map(flattenJson(a));
        for (const row of rows) {
          if (row.change === 'removed') rebuilt.delete(row.path);
          else if (row.after !== undefined) rebuilt.set(row.path, row.after);
        }
        expect(new Map([...rebuilt.entries()].sort())).toEqual(
          new Map([...flattenJson(b).entries()].sort()),
        );
        // Every path appears once.
        expect(new Set(rows.map((r) => r.path)).size).toBe(rows.length);
      }),
    );
  });
});
