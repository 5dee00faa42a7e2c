/**
 * The figures: worst reflection in the band against the goal, the bandwidth that meets the goal,
 * the match at the centre, the limit gauge and, with a drive power, each part's peak voltage and
 * current at the centre with the cautions beside them.
 */
import type { Design } from '../../../../shared/rf/design';
import { elementName } from '../chain/element-catalog';
import { worstMeetsGoal, type AnalysisView } from './analysis-view';
import {
  bandwidthFigure,
  centreMatch,
  frequencyRangeText,
  goalText,
  limitGaugeFigure,
  powerText,
  returnLossText,
  stressText,
  vswrText,
} from './figure-text';
import { LimitGauge } from './limit-gauge';
import { TransmitCautions } from './product-cautions';

export interface FiguresProps {
  design: Design;
  result: AnalysisView | null;
  error: string | null;
}

function Verdict({ ok, yes, no }: { ok: boolean; yes: string; no: string }) {
  return (
    <span className={ok ? 'whitespace-nowrap rounded-full bg-teal-soft px-2 py-0.5 text-[11px] font-bold text-teal-deep' : 'whitespace-nowrap rounded-full bg-coral-soft px-2 py-0.5 text-[11px] font-bold text-coral-deep'}>
      {ok ? yes : no}
    </span>
  );
}

function Row({ term, children, testId }: { term: string; children: React.ReactNode; testId?: string }) {
  return (
    <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-0.5 py-1" data-testid={testId}>
      <dt className="text-xs font-semibold text-ink-soft">{term}</dt>
      <dd className="numeric text-right text-sm text-ink">{children}</dd>
    </div>
  );
}

export function FiguresPanel({ design, result, error }: FiguresProps) {
  if (!result)
    return <p className="text-sm text-ink-faint">{error ? `No figures: ${error}` : 'Working out the figures…'}</p>;
  const meets = worstMeetsGoal(design, result.worstInBand);
  const bw = bandwidthFigure(design, result.bandwidth);
  const centre = centreMatch(design, result.stagesAtCenter);
  const gauge = limitGaugeFigure(result.limit, result.bandwidth);
  const names = new Map(design.elements.map((e) => [e.id, elementName(e)]));
  return (
    <div className="flex flex-col gap-4">
      <section aria-labelledby="fig-band">
        <h3 id="fig-band" className="mb-1 text-sm font-bold text-ink">
          Band {frequencyRangeText(design.band.startHz, design.band.stopHz)}, goal {goalText(design.goal)}
        </h3>
        <dl className="divide-y divide-rule/60">
          <Row term="Worst in band" testId="figure-worst">
            VSWR {vswrText(result.worstInBand.vswr)} · RL {returnLossText(result.worstInBand.returnLossDb)}{' '}
            <Verdict ok={meets} yes="meets the goal" no="misses the goal" />
          </Row>
          <Row term="Bandwidth at the goal" testId="figure-bandwidth">
            {bw ? (
              <>
                {bw.width} ({bw.fractional}) <span className="text-ink-soft">{bw.range}</span>{' '}
                <Verdict ok={bw.coversBand} yes="covers the band" no="narrower than the band" />
              </>
            ) : (
              <span className="text-coral-deep">no match at the centre</span>
            )}
          </Row>
          <Row term="Match at the centre" testId="figure-centre">
            {centre ? (
              <>
                |Γ| {centre.gammaText} · VSWR {centre.vswr} · RL {centre.returnLoss}
              </>
            ) : (
              '—'
            )}
          </Row>
        </dl>
      </section>

      <section aria-label="Limit gauge">
        <LimitGauge figure={gauge} />
      </section>

      <section aria-labelledby="fig-stress">
        <h3 id="fig-stress" className="mb-1 text-sm font-bold text-ink">
          Part stress at the centre
        </h3>
        {!design.drive ? (
          <p className="text-xs text-ink-faint">Set a drive power (Band &amp; port tab) to see each part’s peak voltage and current.</p>
        ) : (
          <>
            <p className="mb-1 text-xs text-ink-soft">With {powerText(design.drive.powerW)} available from the port:</p>
            {result.stressAtCenter && result.stressAtCenter.length > 0 ? (
              <table className="mb-2 w-full text-sm">
                <thead>
                  <tr className="text-left text-xs text-ink-soft">
                    <th scope="col" className="py-1 font-semibold">
                      Element
                    </th>
                    <th scope="col" className="py-1 text-right font-semibold">
                      Peak voltage
                    </th>
                    <th scope="col" className="py-1 text-right font-semibold">
                      Peak current
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {result.stressAtCenter.map((s) => {
                    const t = stressText(s);
                    return (
                      <tr key={s.id} className="border-t border-rule/60">
                        <th scope="row" className="py-1 text-left font-semibold">
                          {names.get(s.id) ?? s.id}
                        </th>
                        <td className="numeric py-1 text-right">{t.voltage}</td>
                        <td className="numeric py-1 text-right">{t.current}</td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            ) : (
              <p className="mb-2 text-xs text-ink-faint">The chain has no parts yet.</p>
            )}
            <TransmitCautions />
          </>
        )}
      </section>
    </div>
  );
}

/** One line of the key figures, always in view above the charts. */
export function FiguresSummary({ design, result, pending }: { design: Design; result: AnalysisView | null; pending: boolean }) {
  if (!result) return <p className="text-xs text-ink-faint">{pending ? 'Analysing…' : 'No analysis yet.'}</p>;
  const meets = worstMeetsGoal(design, result.worstInBand);
  const bw = bandwidthFigure(design, result.bandwidth);
  const gauge = limitGaugeFigure(result.limit, result.bandwidth);
  return (
    <dl className="flex flex-wrap items-center gap-x-5 gap-y-1 text-xs" aria-label="Key figures" aria-live="polite">
      <div className="flex items-baseline gap-1.5" data-testid="summary-worst">
        <dt className="font-semibold text-ink-soft">Worst in band</dt>
        <dd className="numeric font-bold text-ink">VSWR {vswrText(result.worstInBand.vswr)}</dd>
        <dd>
          <Verdict ok={meets} yes="in goal" no="outside goal" />
        </dd>
      </div>
      <div className="flex items-baseline gap-1.5" data-testid="summary-bandwidth">
        <dt className="font-semibold text-ink-soft">Bandwidth</dt>
        <dd className="numeric font-bold text-ink">{bw ? `${bw.width} (${bw.fractional})` : 'no match'}</dd>
      </div>
      <div className="flex items-baseline gap-1.5" data-testid="summary-goal">
        <dt className="font-semibold text-ink-soft">Goal</dt>
        <dd className="numeric text-ink">{goalText(design.goal)}</dd>
      </div>
      {gauge && (
        <div className="flex items-baseline gap-1.5">
          <dt className="font-semibold text-ink-soft">Of Bode–Fano bound</dt>
          <dd className="numeric text-ink">{gauge.ratio}</dd>
        </div>
      )}
    </dl>
  );
}
