import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * Dates are written in one place, shared/format/figures.ts, in the unit's locale. A screen, a
 * sheet or an e-mail that formats a date itself (the browser's locale, or a pattern such as
 * "d MMM yyyy") would drift from it; this walks the code and names any that does.
 */
const root = path.resolve(__dirname, '../..');
const home = path.join('shared', 'format', 'figures.ts');

const stray: { pattern: RegExp; what: string }[] = [
  { pattern: /\.toLocale(Date|Time)?String\(/, what: 'the browser’s or server’s own locale' },
  {
    pattern: /\bDATE(TIME)?_(SHORT|MED|FULL|HUGE)\b/,
    what: 'a locale preset outside the one home',
  },
  {
    // A luxon pattern with a day or month in it ('d LLL yyyy', 'dd/MM/yyyy', 'cccc d LLLL'); the
    // machine's ISO order ('yyyy-MM', a datetime-local value 'yyyy-LL-ddTHH:mm') is no stray.
    pattern: /toFormat\(\s*['"`](?!yyyy-)[^'"`]*\b(d{1,2}|M{1,4}|L{1,4}|c{3,4}|E{3,4})\b/,
    what: 'a hand-written date pattern',
  },
  { pattern: /\bunitDateFigures\b/, what: 'the old second home of the date pattern' },
  {
    // An ISO time cut by hand for show ('2026-12-03 08:00', '08:00'): UTC shown as the ward's
    // time. Cutting out the date part for a formatter (`.slice(0, 10)`) is no stray.
    pattern: /\.slice\(11, 1[69]\)|\.slice\(0, 1[69]\)\.replace\(/,
    what: 'an ISO time cut by hand (UTC shown as local)',
  },
];

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return sources(full);
    return /\.(ts|tsx)$/.test(name) ? [full] : [];
  });
}

describe('one home for writing dates', () => {
  it('no file in src/, server/ or shared/ but the formatters’ own formats a date by itself', () => {
    const found: string[] = [];
    for (const dir of ['src', 'server', 'shared']) {
      for (const file of sources(path.join(root, dir))) {
        const relative = path.relative(root, file);
        // server/ops prints to a developer's terminal (benchmark figures), never to staff.
        if (relative === home || relative.startsWith(path.join('server', 'ops'))) continue;
        readFileSync(file, 'utf8')
          .split('\n')
          .forEach((line, index) => {
            for (const { pattern, what } of stray)
              if (pattern.test(line))
                found.push(`${relative}:${index + 1} (${what}): ${line.trim()}`);
          });
      }
    }
    expect(found).toEqual([]);
  });

  it('the check itself catches the kinds of stray it is for', () => {
    const caught = (line: string) => stray.some(({ pattern }) => pattern.test(line));
    expect(caught("at.toFormat('d LLL yyyy')")).toBe(true);
    expect(caught('day.toFormat(`dd/MM/yyyy`)')).toBe(true);
    expect(caught('new Date(iso).toLocaleDateString()')).toBe(true);
    expect(caught('at.toLocaleString(DateTime.DATE_MED)')).toBe(true);
    expect(caught("c.checkedAt.slice(0, 16).replace('T', ' ')")).toBe(true);
    expect(caught('last.checkedAt.slice(11, 16)')).toBe(true);
    expect(caught('formatDate(version.approvedAt.slice(0, 10))')).toBe(false);
    expect(caught("at.toFormat('HH:mm')")).toBe(false);
    expect(caught("at.toFormat('yyyy-MM')")).toBe(false);
  });
});
