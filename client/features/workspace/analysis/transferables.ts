/** The distinct ArrayBuffers under every typed array in a value (for postMessage transfer lists). */
export function transferablesOf(value: unknown, out: Set<ArrayBuffer> = new Set(), seen: Set<object> = new Set()): ArrayBuffer[] {
  const walk = (v: unknown) => {
    if (v === null || typeof v !== 'object' || seen.has(v)) return;
    seen.add(v);
    if (ArrayBuffer.isView(v)) {
      if (v.buffer instanceof ArrayBuffer && v.buffer.byteLength > 0) out.add(v.buffer);
      return;
    }
    if (Array.isArray(v)) {
      for (const x of v) walk(x);
      return;
    }
    for (const x of Object.values(v)) walk(x);
  };
  walk(value);
  return [...out];
}
