import type { ProtocolVersion } from './protocol-schema';

/**
 * Differences between two protocol versions, value by value. Both definitions are flattened to
 * JSON paths (`light.irradianceMwPerCm2`, `steps[3].durationS`) and compared leaf by leaf;
 * arrays are compared by index, so a step inserted in the middle shows as every later step
 * changed — which is what the step clock will do differently. Nothing is ignored: titles,
 * citations and the approval block count as much as the numbers.
 */

/** What sits at the end of a path: a JSON scalar, or an empty array or object (kept so it is not lost). */
export type JsonLeaf =
  string | number | boolean | null | readonly [] | Readonly<Record<string, never>>;

export type ChangeKind = 'added' | 'removed' | 'changed';

export type ProtocolDifference = {
  path: string;
  /** Undefined when the path exists only in the later version. */
  before: JsonLeaf | undefined;
  /** Undefined when the path exists only in the earlier version. */
  after: JsonLeaf | undefined;
  change: ChangeKind;
};

/** Every path of both versions, including those that did not change, in reading order. */
export type ProtocolComparisonRow = Omit<ProtocolDifference, 'change'> & {
  change: ChangeKind | 'unchanged';
};

const identifier = /^[A-Za-z_$][A-Za-z0-9_$]*$/;

function childPath(parent: string, key: string | number): string {
  if (typeof key === 'number') return `${parent}[${key}]`;
  if (identifier.test(key)) return parent === '' ? key : `${parent}.${key}`;
  // A key a dot path cannot carry ("a.b", "", "x y") is quoted, so no two paths collide.
  return `${parent}[${JSON.stringify(key)}]`;
}

function isPlainObject(value: object): value is Record<string, unknown> {
  const prototype = Object.getPrototypeOf(value) as unknown;
  return prototype === Object.prototype || prototype === null;
}

/**
 * Flattens a JSON value to an ordered map of path → leaf. Object properties that are undefined
 * are left out, as JSON leaves them out; anything JSON cannot carry is refused, not guessed at.
 */
export function flattenJson(value: unknown): Map<string, JsonLeaf> {
  const leaves = new Map<string, JsonLeaf>();
  const visit = (node: unknown, path: string): void => {
    const where = path === '' ? '$' : path;
    if (node === null || typeof node === 'string' || typeof node === 'boolean') {
      leaves.set(where, node);
      return;
    }
    if (typeof node === 'number') {
      if (!Number.isFinite(node))
        throw new TypeError(`flattenJson: ${where} is ${node}, which JSON cannot carry`);
      leaves.set(where, node);
      return;
    }
    if (Array.isArray(node)) {
      if (node.length === 0) leaves.set(where, []);
      node.forEach((item, index) => visit(item, childPath(path, index)));
      return;
    }
    if (typeof node === 'object' && isPlainObject(node)) {
      const keys = Object.keys(node).filter((key) => node[key] !== undefined);
      if (keys.length === 0) leaves.set(where, {});
      for (const key of keys) visit(node[key], childPath(path, key));
      return;
    }
    throw new TypeError(
      `flattenJson: ${where} is ${typeof node === 'object' ? 'not a plain object' : typeof node}, which JSON cannot carry`,
    );
  };
  visit(value, '');
  return leaves;
}

function sameLeaf(a: JsonLeaf, b: JsonLeaf): boolean {
  if (a === b) return true;
  if (Array.isArray(a) || Array.isArray(b)) return Array.isArray(a) && Array.isArray(b);
  // Two empty objects (the only objects a leaf can be).
  return typeof a === 'object' && typeof b === 'object' && a !== null && b !== null;
}

/**
 * Paths of both versions in one reading order: the later version's order, with paths found only
 * in the earlier version placed where they stood in it (before anything added at that point).
 */
function mergedOrder(before: string[], after: string[]): string[] {
  const beforeIndex = new Map(before.map((path, index) => [path, index]));
  const inAfter = new Set(after);
  const order: string[] = [];
  let next = 0;
  const placeEarlierOnly = (until: number): void => {
    for (; next < until; next++) {
      const earlier = before[next] as string;
      if (!inAfter.has(earlier)) order.push(earlier);
    }
  };
  for (const path of after) {
    const at = beforeIndex.get(path);
    if (at !== undefined) {
      placeEarlierOnly(at);
      next = Math.max(next, at + 1);
    } else {
      // What was removed at this point reads before what was added there, as in a diff.
      while (next < before.length && !inAfter.has(before[next] as string))
        order.push(before[next++] as string);
    }
    order.push(path);
  }
  placeEarlierOnly(before.length);
  return order;
}

/** Lines up every path of two JSON values, marking each as added, removed, changed or unchanged. */
export function compareJson(a: unknown, b: unknown): ProtocolComparisonRow[] {
  const before = flattenJson(a);
  const after = flattenJson(b);
  return mergedOrder([...before.keys()], [...after.keys()]).map((path) => {
    const was = before.get(path);
    const now = after.get(path);
    const beforeHas = before.has(path);
    const afterHas = after.has(path);
    if (!afterHas) return { path, before: was, after: undefined, change: 'removed' };
    if (!beforeHas) return { path, before: undefined, after: now, change: 'added' };
    return {
      path,
      before: was,
      after: now,
      change: sameLeaf(was as JsonLeaf, now as JsonLeaf) ? 'unchanged' : 'changed',
    };
  });
}

/** Every path of two protocol versions with whether it changed; the screen's "show all" view. */
export function compareProtocolVersions(
  a: ProtocolVersion,
  b: ProtocolVersion,
): ProtocolComparisonRow[] {
  return compareJson(a, b);
}

/** Only the paths that differ between version `a` (before) and version `b` (after). */
export function diffProtocolVersions(a: ProtocolVersion, b: ProtocolVersion): ProtocolDifference[] {
  return compareJson(a, b).filter((row): row is ProtocolDifference => row.change !== 'unchanged');
}
