import { describe, expect, it } from 'vitest';
import {
  hasDashedOutline,
  orderStatusMeaning,
  orderStatusTable,
  orderStatusWords,
} from '../../src/components/ui/order-status-words';
import * as lifecycle from '../../shared/orders/lifecycle';
import { orderStatuses } from '../../shared/schemas/orders';

// The one table of what each order status is called and means, read by every status label and badge.

describe('the order status table', () => {
  it('has an entry for every status and no other', () => {
    expect(Object.keys(orderStatusTable).sort()).toEqual([...orderStatuses].sort());
  });

  it('gives every status a short word, a long word, a one-sentence meaning and an icon', () => {
    for (const status of orderStatuses) {
      const { short, long, meaning, Icon } = orderStatusTable[status];
      expect(short.trim(), status).not.toBe('');
      expect(long.trim(), status).not.toBe('');
      expect(meaning, status).toMatch(/^[A-Z][^.]*\.$/);
      expect(typeof Icon, status).toBe('function');
    }
  });

  it('never gives two statuses the same short word, the same long word or the same icon', () => {
    const distinct = (values: unknown[]) => new Set(values).size;
    const entries = Object.values(orderStatusTable);
    expect(distinct(entries.map((e) => e.short.toLowerCase()))).toBe(orderStatuses.length);
    expect(distinct(entries.map((e) => e.long.toLowerCase()))).toBe(orderStatuses.length);
    expect(distinct(entries.map((e) => e.Icon))).toBe(orderStatuses.length);
  });

  it('the long word starts with the short one, so the worklists and the pharmacy screens name a status alike', () => {
    for (const status of orderStatuses)
      expect(
        orderStatusWords(status, 'long').startsWith(orderStatusWords(status, 'short')),
        status,
      ).toBe(true);
  });

  it('reads the words and the meaning from the table, the short word by default', () => {
    expect(orderStatusWords('stopped')).toBe('Stopped early');
    expect(orderStatusWords('signed', 'long')).toBe('Signed, waiting for dose check');
    expect(orderStatusMeaning('in-session')).toBe('The session is running on the step clock.');
  });

  it('draws only an unsigned draft, a replaced revision and a cancelled order with a dashed outline', () => {
    expect(orderStatuses.filter(hasDashedOutline).sort()).toEqual([
      'cancelled',
      'draft',
      'superseded',
    ]);
  });

  it('has words for every status the lifecycle names: each one moved from or to, and each group the screens read', () => {
    const named = new Set<string>();
    for (const [from, targets] of Object.entries(lifecycle.orderTransitions)) {
      named.add(from);
      for (const to of targets) named.add(to);
    }
    for (const group of Object.values(lifecycle))
      if (Array.isArray(group)) for (const status of group) named.add(String(status));
    for (const status of named) {
      expect(Object.hasOwn(orderStatusTable, status), status).toBe(true);
      expect(orderStatusWords(status as never).trim(), status).not.toBe('');
    }
    expect(named.size).toBe(orderStatuses.length);
  });
});
