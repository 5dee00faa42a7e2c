import { describe, expect, it } from 'vitest';
import { drawingKeyOf, sameDrawingProps } from '../../client/features/workspace/analysis/drawing-key';
import { chipAntennaDesign } from './analysis-fixtures';

describe('sameDrawingProps', () => {
  const result = {};
  it('treats a design whose only change is a tuned value as the same drawing', () => {
    const a = chipAntennaDesign();
    const b = chipAntennaDesign({ elements: [{ id: 'c1', kind: 'shunt-c', value: 1.3e-12 }, { id: 'l1', kind: 'series-l', value: 2.7e-9 }] });
    expect(drawingKeyOf(a)).toBe(drawingKeyOf(b));
    expect(sameDrawingProps({ design: a, result }, { design: b, result })).toBe(true);
  });

  it('redraws for a new result, a new band, goal or reference, or a different chain length', () => {
    const a = chipAntennaDesign();
    expect(sameDrawingProps({ design: a, result }, { design: a, result: {} })).toBe(false);
    for (const over of [
      { band: { startHz: 2.41e9, stopHz: 2.4835e9 } },
      { goal: { minReturnLossDb: 10 } },
      { referenceOhms: 75 },
      { elements: [{ id: 'c1', kind: 'shunt-c', value: 1.2e-12 }] },
    ])
      expect(sameDrawingProps({ design: a, result }, { design: chipAntennaDesign(over), result })).toBe(false);
    expect(sameDrawingProps({ design: a, result, extra: 1 } as never, { design: a, result } as never)).toBe(false);
  });
});
