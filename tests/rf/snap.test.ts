import { describe, expect, it } from 'vitest';
import { nearestPreferred, type ESeries } from '../../shared/rf/eseries';
import { chainSnapped, preferredNearest } from '../../shared/rf/snap';
import { prngFrom, prngUniform } from '../../shared/rf/prng';
import type { Element } from '../../shared/rf/design';

describe('snap', () => {
  it('preferredNearest equals eseries nearestPreferred for 20,000 seeded values over 24 decades (IEC 60063 tables; common practice)', () => {
    const p = prngFrom(60063);
    const mismatches: string[] = [];
    for (const series of ['E6', 'E12', 'E24', 'E96'] as ESeries[])
      for (let i = 0; i < 5000; i++) {
        const v = Math.pow(10, -15 + prngUniform(p) * 24);
        if (preferredNearest(v, series) !== nearestPreferred(v, series)) mismatches.push(`${series} ${v}`);
      }
    expect(mismatches).toEqual([]);
    // exact decade edges and preferred values themselves
    for (const v of [1e-12, 1e-9, 4.7e-9, 8.2e-12, 9.99e-10, 1.0000001e-9]) expect(preferredNearest(v, 'E12')).toBe(nearestPreferred(v, 'E12'));
  });

  it('chainSnapped moves L and C values only and leaves skipped elements alone (common practice)', () => {
    const chain: Element[] = [
      { id: 'C1', kind: 'shunt-c', value: 2.05e-12 },
      { id: 'R1', kind: 'series-r', value: 12.3 },
      { id: 'TL1', kind: 'line', z0: 50, length: { degrees: 33, atHz: 1e9 } },
      { id: 'L1', kind: 'series-l', value: 4.1e-9 },
    ];
    const s = chainSnapped(chain, 'E12', (i) => i === 3);
    expect((s[0] as { value: number }).value).toBe(2.2e-12);
    expect(s[1]).toBe(chain[1]);
    expect(s[2]).toBe(chain[2]);
    expect(s[3]).toBe(chain[3]);
  });
});
