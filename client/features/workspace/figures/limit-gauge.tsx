/**
 * The limit gauge: how much of the Bode–Fano bound (the widest bandwidth any lossless network
 * could give this load at the goal's reflection) the design's bandwidth uses.
 */
import type { LimitGaugeFigure } from './figure-text';

export function LimitGauge({ figure }: { figure: LimitGaugeFigure | null }) {
  if (!figure)
    return (
      <p className="text-xs text-ink-faint" data-testid="limit-gauge">
        No Bode–Fano bound for this load: it does not behave like a simple RC or RL load at the centre.
      </p>
    );
  const pct = Math.round(figure.fill * 100);
  return (
    <div data-testid="limit-gauge">
      <div className="mb-1 flex items-baseline justify-between text-xs">
        <span className="font-semibold text-ink">Limit gauge</span>
        <span className="numeric font-bold text-ink">{figure.ratio}</span>
      </div>
      <div
        role="meter"
        aria-label="Design bandwidth as a share of the Bode–Fano bound"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
        aria-valuetext={`${figure.ratio} of the bound`}
        className="relative h-3 overflow-hidden rounded-full border border-rule bg-paper-deep"
      >
        <div className="h-full rounded-full bg-violet" style={{ width: `${pct}%` }} />
      </div>
      <p className="mt-1 text-[11px] text-ink-soft">
        Design <span className="numeric">{figure.design}</span> of the bound <span className="numeric">{figure.bound}</span> ({figure.model}{' '}
        load fitted at the centre).
      </p>
    </div>
  );
}
