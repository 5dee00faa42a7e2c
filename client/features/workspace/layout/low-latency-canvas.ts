/**
 * Low-latency 2D contexts for the workspace's on-screen canvases (Konva layers and the uPlot sweep
 * plot): `getContext('2d', { desynchronized: true })`, the browser's hint for canvases redrawn on
 * every input event.
 *
 * Why: without it, Chromium hands every non-blank canvas on the page to the compositor again at
 * every frame, changed or not (Canvas2DResourceProvider::ProduceCanvasResource and a copy in
 * LayerTreeHost::DoUpdateLayers). With three chart layers, the plot and the chain canvas that was
 * about 5 ms of main-thread time per frame in headless Chromium, two frames per tuning step.
 * A desynchronized canvas is handed over only when drawn.
 *
 * Contexts that read pixels back (`willReadFrequently`, Konva's hit canvases) are left as they are;
 * browsers that do not know the hint ignore it.
 */
import Konva from 'konva';

type GetContext = HTMLCanvasElement['getContext'];

/** Set while off-screen canvases are made (see `offScreen`). */
let offScreenDepth = 0;

function lowLatencyOptions(type: string, options: unknown): unknown {
  if (type !== '2d' || offScreenDepth > 0) return options;
  const o = (options ?? {}) as CanvasRenderingContext2DSettings;
  return o.willReadFrequently ? options : { ...o, desynchronized: true };
}

/** Make `canvas`'s first 2D context a desynchronized one (a canvas keeps the context it first got). */
export function preferLowLatency(canvas: HTMLCanvasElement): HTMLCanvasElement {
  const original = canvas.getContext.bind(canvas) as (type: string, options?: unknown) => RenderingContext | null;
  const patched = (type: string, options?: unknown) => original(type, lowLatencyOptions(type, options));
  canvas.getContext = patched as GetContext;
  return canvas;
}

let konvaDone = false;

/** Every canvas Konva creates from now on asks for a low-latency 2D context. Idempotent. */
export function installLowLatencyKonvaCanvases(): void {
  if (konvaDone || typeof document === 'undefined') return;
  konvaDone = true;
  const create = Konva.Util.createCanvasElement.bind(Konva.Util);
  Konva.Util.createCanvasElement = () => preferLowLatency(create());
}

/**
 * Run `build` (e.g. `new uPlot(...)`) with every canvas it creates asking for a low-latency 2D
 * context; the page's other canvases are untouched.
 */
export function withLowLatencyCanvases<T>(build: () => T): T {
  if (typeof HTMLCanvasElement === 'undefined') return build();
  const proto = HTMLCanvasElement.prototype;
  const original = proto.getContext;
  proto.getContext = function (this: HTMLCanvasElement, type: string, options?: unknown) {
    return (original as (type: string, options?: unknown) => RenderingContext | null).call(this, type, lowLatencyOptions(type, options));
  } as GetContext;
  try {
    return build();
  } finally {
    proto.getContext = original;
  }
}

/**
 * Run `build` (e.g. a Konva `node.cache()`) with the canvases it makes asking for ordinary 2D contexts:
 * an off-screen bitmap gains nothing from the hint, and in headless Chromium a desynchronized context
 * costs about a millisecond to make (bench:ui's profile: 230-320 ms in a 200-step drag, with each
 * chain cell cached again whenever it changed).
 */
export function offScreen<T>(build: () => T): T {
  offScreenDepth++;
  try {
    return build();
  } finally {
    offScreenDepth--;
  }
}

/**
 * Cache `node` (a Konva group) as one bitmap of `width` × `height` from its origin, at the screen's pixel
 * ratio, with an ordinary 2D context (see `offScreen`). Any earlier bitmap is released first.
 */
export function cacheOffScreen(node: Konva.Node, width: number, height: number): void {
  node.clearCache();
  offScreen(() => node.cache({ x: 0, y: 0, width, height, pixelRatio: typeof window === 'undefined' ? 1 : window.devicePixelRatio || 1 }));
}
