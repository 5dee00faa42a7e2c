// The workspace's low-latency canvas hint (client/features/workspace/layout/low-latency-canvas.ts): what
// each canvas asks of getContext. On-screen canvases ask for desynchronized 2D contexts; canvases that read
// pixels back, and off-screen bitmaps made inside `offScreen`, ask for ordinary ones.
import { describe, expect, it } from 'vitest';
import { offScreen, preferLowLatency } from '../../client/features/workspace/layout/low-latency-canvas';

/** A stand-in canvas that records the options each getContext call receives. */
function recordingCanvas(): { canvas: HTMLCanvasElement; asked: unknown[] } {
  const asked: unknown[] = [];
  const canvas = {
    getContext(_type: string, options?: unknown) {
      asked.push(options);
      return null;
    },
  };
  return { canvas: canvas as unknown as HTMLCanvasElement, asked };
}

describe('low-latency canvases', () => {
  it('ask for a desynchronized 2D context, keeping the other options', () => {
    // common practice (the HTML canvas spec's `desynchronized` context attribute)
    const { canvas, asked } = recordingCanvas();
    preferLowLatency(canvas).getContext('2d', { alpha: false });
    expect(asked).toEqual([{ alpha: false, desynchronized: true }]);
  });

  it('leave contexts that read pixels back, and other context types, as they are', () => {
    const { canvas, asked } = recordingCanvas();
    preferLowLatency(canvas).getContext('2d', { willReadFrequently: true });
    (canvas.getContext as (t: string, o?: unknown) => unknown)('webgl', { antialias: true });
    expect(asked).toEqual([{ willReadFrequently: true }, { antialias: true }]);
  });

  it('ask for ordinary contexts while off-screen bitmaps are made, and again for desynchronized ones after', () => {
    const off = recordingCanvas();
    const on = recordingCanvas();
    preferLowLatency(off.canvas);
    preferLowLatency(on.canvas);
    const out = offScreen(() => {
      off.canvas.getContext('2d');
      return offScreen(() => 42); // nested: still off-screen until the outer one ends
    });
    expect(out).toBe(42);
    expect(off.asked).toEqual([undefined]);
    on.canvas.getContext('2d');
    expect(on.asked).toEqual([{ desynchronized: true }]);
  });

  it('end the off-screen stretch even when making the bitmap throws', () => {
    const { canvas, asked } = recordingCanvas();
    preferLowLatency(canvas);
    expect(() =>
      offScreen(() => {
        throw new Error('cache failed');
      }),
    ).toThrow('cache failed');
    canvas.getContext('2d');
    expect(asked).toEqual([{ desynchronized: true }]);
  });
});
