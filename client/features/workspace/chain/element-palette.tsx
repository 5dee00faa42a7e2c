/**
 * The palette: one button per element kind, adding it next to the selected element (on its port
 * side) or at the port end, with values that act at the centre frequency. Hidden for observers.
 */
import type { ElementKind } from '../../../../shared/rf/design';
import type { ESeries } from '../../../../shared/rf/eseries';
import { cx } from '../../../lib/cx';
import { KIND_INFO, PALETTE_KINDS } from './element-catalog';

const TINT: Record<string, string> = {
  series: 'border-l-teal',
  shunt: 'border-l-coral',
  line: 'border-l-slate',
  stub: 'border-l-slate',
  transformer: 'border-l-ink',
  'two-port': 'border-l-ink',
};

export function ElementPalette({ onAdd }: { onAdd(kind: ElementKind): void }) {
  return (
    <div role="toolbar" aria-label="Add an element" className="flex flex-wrap items-center gap-1">
      <span className="mr-1 text-xs font-bold text-ink-soft">Add</span>
      {PALETTE_KINDS.map((kind) => {
        const info = KIND_INFO[kind];
        return (
          <button
            key={kind}
            type="button"
            title={`Add a ${info.description}`}
            aria-label={`Add ${info.name.toLowerCase()}`}
            onClick={() => onAdd(kind)}
            className={cx(
              'rounded-sm border border-l-4 border-rule bg-card px-1.5 py-0.5 text-[11px] font-semibold text-ink hover:bg-paper',
              TINT[info.placement],
            )}
          >
            {info.name}
          </button>
        );
      })}
    </div>
  );
}

export const STEP_SERIES: readonly (ESeries | null)[] = [null, 'E12', 'E24', 'E96'];

export function StepSeriesSelect({ value, onChange, id }: { value: ESeries | null; onChange(v: ESeries | null): void; id: string }) {
  return (
    <span className="flex items-center gap-1 text-xs">
      <label htmlFor={id} className="font-semibold text-ink-soft">
        Tuning steps
      </label>
      <select
        id={id}
        value={value ?? 'smooth'}
        onChange={(e) => onChange(e.target.value === 'smooth' ? null : (e.target.value as ESeries))}
        className="rounded-md border border-rule bg-card px-1 py-0.5 text-xs"
      >
        <option value="smooth">smooth (2 %)</option>
        {STEP_SERIES.filter((s): s is ESeries => s !== null).map((s) => (
          <option key={s} value={s}>
            {s} values
          </option>
        ))}
      </select>
    </span>
  );
}
