/** The yield run's histogram of worst in-band VSWR, with the goal marked: bars at or under it in teal, over it in coral. */
import { vswrText } from '../figures/figure-text';

export interface YieldHistogramProps {
  edges: readonly number[];
  counts: readonly number[];
  beyond: number;
  /** the goal as a VSWR, or null */
  goalVswr: number | null;
  width?: number;
  height?: number;
}

export function YieldHistogram({ edges, counts, beyond, goalVswr, width = 320, height = 120 }: YieldHistogramProps) {
  const bins = counts.map((count, i) => ({ lo: edges[i], hi: edges[i + 1], count }));
  if (beyond > 0) bins.push({ lo: edges[edges.length - 1], hi: Number.POSITIVE_INFINITY, count: beyond });
  const max = Math.max(1, ...bins.map((b) => b.count));
  const pad = { l: 6, r: 6, t: 6, b: 22 };
  const w = (width - pad.l - pad.r) / Math.max(1, bins.length);
  const h = height - pad.t - pad.b;
  const total = bins.reduce((s, b) => s + b.count, 0);
  const label = `Histogram of worst in-band VSWR over ${total} trials, from ${vswrText(edges[0])} to ${vswrText(edges[edges.length - 1])}${beyond ? `, ${beyond} beyond` : ''}`;
  return (
    <figure className="flex flex-col gap-1">
      <svg viewBox={`0 0 ${width} ${height}`} width="100%" role="img" aria-label={label} className="rounded-md border border-rule bg-card">
        {bins.map((b, i) => {
          const bh = (b.count / max) * h;
          const pass = goalVswr !== null && b.hi <= goalVswr * (1 + 1e-9);
          return (
            <rect
              key={i}
              x={pad.l + i * w + 1}
              y={pad.t + h - bh}
              width={Math.max(1, w - 2)}
              height={bh}
              fill={pass ? '#1d8a84' : '#e06a4f'}
              opacity={b.hi === Number.POSITIVE_INFINITY ? 0.6 : 1}
            >
              <title>{`${vswrText(b.lo)}–${Number.isFinite(b.hi) ? vswrText(b.hi) : 'more'}: ${b.count} trials`}</title>
            </rect>
          );
        })}
        <line x1={pad.l} x2={width - pad.r} y1={pad.t + h} y2={pad.t + h} stroke="#1e2b47" strokeWidth={1} />
        <text x={pad.l} y={height - 6} fontSize={10} fill="#45526e">
          VSWR {vswrText(edges[0])}
        </text>
        <text x={width - pad.r} y={height - 6} fontSize={10} fill="#45526e" textAnchor="end">
          {beyond ? `> ${vswrText(edges[edges.length - 1])}` : vswrText(edges[edges.length - 1])}
        </text>
        {goalVswr !== null && (() => {
          const last = edges[edges.length - 1];
          const first = edges[0];
          if (!(goalVswr >= first && goalVswr <= last) || last === first) return null;
          const x = pad.l + ((goalVswr - first) / (last - first)) * (counts.length * w);
          return (
            <g>
              <line x1={x} x2={x} y1={pad.t} y2={pad.t + h} stroke="#8a5a0e" strokeWidth={1.5} strokeDasharray="4 3" />
              <text x={x + 3} y={pad.t + 10} fontSize={10} fill="#8a5a0e">
                goal {vswrText(goalVswr)}
              </text>
            </g>
          );
        })()}
      </svg>
    </figure>
  );
}
