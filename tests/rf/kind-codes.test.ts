import { describe, expect, it } from 'vitest';
import { ANALYZE_KIND_CODES } from '../../shared/rf/analyze';
import { CASCADE_KIND_CODES } from '../../shared/rf/cascade';
import * as elements from '../../shared/rf/elements';

describe('kind codes', () => {
  it('the sweep loops of cascade.ts and analyze.ts use the codes of elements.ts (local copies for speed)', () => {
    for (const [name, code] of Object.entries(CASCADE_KIND_CODES)) expect(code, name).toBe(elements[name as keyof typeof elements]);
    for (const [name, code] of Object.entries(ANALYZE_KIND_CODES)) expect(code, name).toBe(elements[name as keyof typeof elements]);
  });
});
