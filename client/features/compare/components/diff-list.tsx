import type { DesignDiff } from '../../../../shared/api/design-diff';
import type { Design } from '../../../../shared/rf/design';
import { cx } from '../../../lib/cx';
import { diffRows, type DiffKind } from './diff-rows';

const kindStyle: Record<DiffKind, { word: string; tone: string }> = {
  field: { word: 'design', tone: 'bg-slate-soft text-ink-soft border-slate/40' },
  added: { word: 'added', tone: 'bg-teal-soft text-teal-deep border-teal/40' },
  removed: { word: 'removed', tone: 'bg-coral-soft text-coral-deep border-coral/40' },
  changed: { word: 'changed', tone: 'bg-amber-soft text-amber-deep border-amber/50' },
  moved: { word: 'moved', tone: 'bg-violet-soft text-violet-deep border-violet/40' },
};

export interface DiffListProps {
  diff: DesignDiff;
  a: Design;
  b: Design;
  aLabel: string;
  bLabel: string;
}

/** What differs between two designs, side by side: the change, its value in a, its value in b. */
export function DiffList({ diff, a, b, aLabel, bLabel }: DiffListProps) {
  if (diff.identical)
    return (
      <p role="status" className="rounded-xl border border-rule bg-card px-4 py-3 text-ink-soft">
        The two designs are the same: no field and no element differs.
      </p>
    );
  const rows = diffRows(diff, a, b);
  return (
    <div className="overflow-x-auto rounded-xl border border-rule bg-card">
      <table className="w-full border-collapse text-left text-sm" aria-label="Differences">
        <thead className="border-b border-rule bg-paper-deep/50">
          <tr>
            <th scope="col" className="px-3 py-2 font-bold text-ink-soft">
              What
            </th>
            <th scope="col" className="px-3 py-2 font-bold text-ink-soft">
              {aLabel}
            </th>
            <th scope="col" className="px-3 py-2 font-bold text-ink-soft">
              {bLabel}
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {rows.map((row) => (
            <tr key={row.key} data-diff-kind={row.kind} className="align-top">
              <th scope="row" className="px-3 py-2 text-left font-semibold">
                <span className={cx('mr-2 inline-block rounded-full border px-2 py-0.5 text-[0.7rem] font-bold tracking-wide uppercase', kindStyle[row.kind].tone)}>
                  {kindStyle[row.kind].word}
                </span>
                {row.subject}
              </th>
              <td className={cx('numeric px-3 py-2', row.kind === 'removed' && 'text-coral-deep line-through decoration-coral/60')}>{row.before}</td>
              <td className={cx('numeric px-3 py-2', row.kind === 'added' && 'font-semibold text-teal-deep')}>{row.after}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
