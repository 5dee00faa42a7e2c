/**
 * Two designs (snapshots or the live room) side by side: both band traces and impedance paths on one
 * Smith chart, both curves on one sweep plot (b drawn solid, a dashed), their headline figures, and
 * the list of what differs. Both are analysed in the browser by the room screen's engine.
 */
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { buttonClass } from '../../../components/button';
import { Loading } from '../../../components/page-status';
import { paths } from '../../../config/paths';
import { cx } from '../../../lib/cx';
import { dateFrom, dateTimeLabel, timeAgo } from '../../../lib/format-time';
import { formatEngineering } from '../../../../shared/rf/units';
import { useElementWidth } from '../../../lib/use-element-width';
import { SmithChart } from '../../workspace/chart/smith-chart';
import { SweepPlot, type SweepPlotMode } from '../../workspace/plot/sweep-plot';
import { useComparison, type CompareSideView } from '../api/get-compare';
import { DiffList } from './diff-list';
import { useDesignPairAnalysis, type SideAnalysis } from './use-design-pair-analysis';

export interface CompareViewProps {
  roomId: string;
  a: string;
  b: string;
}

function sideCaption(side: CompareSideView): string {
  if (side.kind === 'live') return `the room now (${side.label})`;
  const date = dateFrom(side.createdAt);
  return `snapshot “${side.label}”${date ? `, ${timeAgo(date)}` : ''}`;
}

/** "“E12 values”" or "Live room" — a short name for column heads and the chart legend. */
const sideName = (side: CompareSideView) => (side.kind === 'live' ? 'Live room' : `“${side.label}”`);

function FigureCells({ analysis }: { analysis: SideAnalysis }) {
  if (analysis.state === 'running')
    return (
      <td colSpan={3} className="px-3 py-2 text-ink-soft">
        analysing…
      </td>
    );
  if (analysis.state === 'failed')
    return (
      <td colSpan={3} className="px-3 py-2 font-semibold text-coral-deep">
        {analysis.message}
      </td>
    );
  const { worstInBand, bandwidth } = analysis.result;
  const vswr = Number.isFinite(worstInBand.vswr) ? worstInBand.vswr.toFixed(2) : '∞';
  return (
    <>
      <td className="numeric px-3 py-2">{vswr}</td>
      <td className="numeric px-3 py-2">{formatEngineering(worstInBand.returnLossDb, 'dB', { digits: 3 })}</td>
      <td className="numeric px-3 py-2">
        {bandwidth
          ? `${formatEngineering(bandwidth.lowHz, 'Hz', { digits: 4 })} – ${formatEngineering(bandwidth.highHz, 'Hz', { digits: 4 })} (${(bandwidth.fractional * 100).toPrecision(3)} %)`
          : 'goal missed at the centre'}
      </td>
    </>
  );
}

/** Where a chart would be while its design is analysed, or why it cannot be drawn. */
function Pending({ analysis }: { analysis: SideAnalysis }) {
  if (analysis.state === 'failed')
    return (
      <p role="alert" className="py-8 text-sm font-semibold text-coral-deep">
        This design cannot be drawn: {analysis.message}
      </p>
    );
  return <Loading label="Analysing…" />;
}

function Charts({ comparison, analyses }: { comparison: { a: CompareSideView; b: CompareSideView }; analyses: { a: SideAnalysis; b: SideAnalysis } }) {
  const [chartBox, chartWidth] = useElementWidth<HTMLDivElement>(480);
  const [plotBox, plotWidth] = useElementWidth<HTMLDivElement>(560);
  const [mode, setMode] = useState<SweepPlotMode>('return-loss');
  const a = analyses.a.state === 'done' ? analyses.a : null;
  const b = analyses.b.state === 'done' ? analyses.b : null;
  const chartSize = Math.max(260, Math.min(chartWidth, 560));
  return (
    <div className="grid items-start gap-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
      <figure className="rounded-2xl border border-rule bg-card p-3 shadow-xs" aria-label="Smith chart of both designs">
        <div ref={chartBox} className="w-full">
          {b ? (
            <SmithChart
              width={chartSize}
              height={chartSize}
              design={comparison.b.design}
              result={b.result}
              path={b.path}
              compare={a ? { result: a.result, path: a.path, label: sideName(comparison.a) } : null}
            />
          ) : (
            <Pending analysis={analyses.b} />
          )}
        </div>
        <figcaption className="mt-2 text-xs text-ink-soft">
          Solid: {sideName(comparison.b)} (band trace in amber, impedance path by element). Dashed: {sideName(comparison.a)}.
        </figcaption>
      </figure>
      <figure className="flex flex-col gap-2 rounded-2xl border border-rule bg-card p-3 shadow-xs" aria-label="Sweep plot of both designs">
        <div className="flex items-center justify-between gap-2">
          <span className="text-sm font-bold">{mode === 'return-loss' ? 'Return loss' : 'VSWR'} across the sweep</span>
          <div role="group" aria-label="Plot" className="flex gap-1">
            {(['return-loss', 'vswr'] as const).map((m) => (
              <button
                key={m}
                type="button"
                aria-pressed={mode === m}
                onClick={() => setMode(m)}
                className={cx('rounded-md border px-2 py-0.5 text-xs font-semibold', mode === m ? 'border-ink bg-ink text-paper' : 'border-rule text-ink-soft hover:border-ink-faint')}
              >
                {m === 'return-loss' ? 'Return loss' : 'VSWR'}
              </button>
            ))}
          </div>
        </div>
        <div ref={plotBox} className="w-full">
          {b ? (
            <SweepPlot
              width={Math.max(280, plotWidth)}
              height={300}
              design={comparison.b.design}
              result={b.result}
              mode={mode}
              compare={a ? { result: a.result, label: sideName(comparison.a) } : null}
            />
          ) : (
            <Pending analysis={analyses.b} />
          )}
        </div>
        <figcaption className="text-xs text-ink-soft">
          Solid amber: {sideName(comparison.b)}. Dashed slate: {sideName(comparison.a)}. The band is shaded, the goal dashed.
        </figcaption>
      </figure>
    </div>
  );
}

export function CompareView({ roomId, a, b }: CompareViewProps) {
  const comparison = useComparison(roomId, a, b);
  const analyses = useDesignPairAnalysis(comparison.data?.a.design ?? null, comparison.data?.b.design ?? null);

  if (comparison.isError)
    return (
      <div role="alert" className="rounded-2xl border border-coral/50 bg-coral-soft p-5">
        <p className="font-bold text-coral-deep">These two cannot be compared</p>
        <p className="mt-1 text-ink">{comparison.error.message}</p>
        <Link to={paths.snapshots.getHref(roomId)} className={cx(buttonClass('secondary', 'sm'), 'mt-3')}>
          Pick from the snapshots
        </Link>
      </div>
    );
  if (!comparison.data) return <Loading label="Loading both designs…" />;
  const { a: sideA, b: sideB, diff } = comparison.data;
  const when = (side: CompareSideView) => {
    const date = dateFrom(side.createdAt);
    return date ? <span title={dateTimeLabel(date)}>{sideCaption(side)}</span> : sideCaption(side);
  };

  return (
    <div className="flex flex-col gap-5" data-testid="compare-view">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-ink-soft">
          From <strong className="text-ink">{when(sideA)}</strong> to <strong className="text-ink">{when(sideB)}</strong>
        </p>
        <Link to={paths.compare.getHref(roomId, b, a)} className={buttonClass('secondary', 'sm')}>
          Swap the two
        </Link>
      </div>

      <Charts comparison={comparison.data} analyses={analyses} />

      <section aria-labelledby="compare-figures-title">
        <h2 id="compare-figures-title" className="mb-2 text-lg font-extrabold">
          Figures
        </h2>
        <div className="overflow-x-auto rounded-xl border border-rule bg-card">
          <table className="w-full border-collapse text-left text-sm">
            <thead className="border-b border-rule bg-paper-deep/50">
              <tr>
                {['Design', 'Worst VSWR in band', 'Worst return loss in band', 'Bandwidth meeting the goal'].map((h) => (
                  <th key={h} scope="col" className="px-3 py-2 font-bold text-ink-soft">
                    {h}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {([
                ['a', sideA],
                ['b', sideB],
              ] as const).map(([key, side]) => (
                <tr key={key}>
                  <th scope="row" className="px-3 py-2 text-left font-semibold">
                    {sideName(side)}
                    <span className="ml-2 text-xs font-normal text-ink-faint">{key === 'a' ? 'dashed' : 'solid'}</span>
                  </th>
                  <FigureCells analysis={analyses[key]} />
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      <section aria-labelledby="compare-diff-title">
        <h2 id="compare-diff-title" className="mb-2 text-lg font-extrabold">
          What changed
        </h2>
        <DiffList diff={diff} a={sideA.design} b={sideB.design} aLabel={sideName(sideA)} bLabel={sideName(sideB)} />
      </section>
    </div>
  );
}
