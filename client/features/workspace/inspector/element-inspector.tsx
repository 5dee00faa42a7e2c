/**
 * The selected element: its label, value (typed or tuned), Q, tolerance, lock, and for lines the
 * impedance and length; with buttons to duplicate, delete and move it along the chain. For an
 * observer every field is read-only and no button that edits is rendered.
 */
import { useId, useState, type ChangeEvent } from 'react';
import { bandCenterHz, type Design, type Element, type Length, type Tolerance } from '../../../../shared/rf/design';
import type { ESeries } from '../../../../shared/rf/eseries';
import { parseTouchstone, TouchstoneError } from '../../../../shared/rf/touchstone';
import { cx } from '../../../lib/cx';
import { elementName, kindInfo } from '../chain/element-catalog';
import { frequencyRangeText } from '../figures/figure-text';
import { tunableOf } from '../value/tunable';
import { compactControl, ValueField } from '../value/value-field';
import { defaultVelocityFactor, lengthInDegrees, lengthInMeters } from './length-convert';
import { smallButton } from './small-button';

export interface ElementActions {
  /** a discrete edit of one field (undefined deletes an optional field) */
  setField(id: string, field: string, value: unknown): void;
  /** several fields of one element in one edit */
  setFields(id: string, fields: Record<string, unknown>): void;
  /** a continuous tune of one field */
  tuneField(id: string, field: string, value: unknown): void;
  remove(id: string): void;
  duplicate(id: string): void;
  move(id: string, index: number): void;
}

export interface ElementInspectorProps {
  design: Design;
  element: Element;
  editable: boolean;
  series: ESeries | null;
  actions: ElementActions;
}

export function ElementInspector({ design, element, editable, series, actions }: ElementInspectorProps) {
  const info = kindInfo(element.kind);
  const index = design.elements.findIndex((e) => e.id === element.id);
  const count = design.elements.length;
  const set = (field: string) => (value: unknown) => actions.setField(element.id, field, value);
  const readOnly = !editable;
  const tunable = tunableOf(element);

  return (
    <section aria-labelledby="inspector-title" className="flex flex-col gap-3" data-testid="element-inspector">
      <header className="flex items-baseline justify-between gap-2">
        <h3 id="inspector-title" className="text-base font-extrabold text-ink">
          {elementName(element)} <span className="text-sm font-semibold text-ink-soft">{info.name}</span>
        </h3>
        <span className="text-xs text-ink-faint">
          {index + 1} of {count} from the load
        </span>
      </header>

      <LabelField key={`label-${element.id}`} label={element.label ?? ''} readOnly={readOnly} onCommit={(v) => set('label')(v || undefined)} />

      {'value' in element && (
        <div className="grid grid-cols-2 gap-2">
          <ValueField
            key={`value-${element.id}`}
            label={`Value (${info.unit})`}
            value={element.value}
            unit={info.unit ?? ''}
            rules={{ positive: true }}
            readOnly={readOnly}
            onCommit={(v) => v !== undefined && set('value')(v)}
            tuning={tunable ? { scale: tunable.scale, series, onTune: (v) => actions.tuneField(element.id, 'value', v) } : undefined}
            hint={readOnly ? undefined : '↑↓ or wheel to tune'}
          />
          <ValueField
            key={`q-${element.id}`}
            label="Q"
            value={element.q}
            unit=""
            optional
            placeholder="ideal"
            rules={{ positive: true }}
            readOnly={readOnly}
            onCommit={set('q')}
            digits={3}
            hint={readOnly ? undefined : 'empty: lossless'}
          />
        </div>
      )}

      {(element.kind === 'line' || element.kind === 'open-stub' || element.kind === 'short-stub') && (
        <LineFields design={design} element={element} readOnly={readOnly} actions={actions} />
      )}

      {element.kind === 'transformer' && (
        <ValueField
          key={`ratio-${element.id}`}
          label="Turns ratio n (port side sees n² × load side)"
          value={element.ratio}
          unit=""
          rules={{ positive: true }}
          readOnly={readOnly}
          onCommit={(v) => v !== undefined && set('ratio')(v)}
          tuning={{ scale: 'log', series: null, onTune: (v) => actions.tuneField(element.id, 'ratio', v) }}
        />
      )}

      {element.kind === 'two-port' && <TwoPortFields element={element} readOnly={readOnly} actions={actions} />}

      {element.kind !== 'two-port' && element.kind !== 'transformer' && (
        <ToleranceFields key={`tol-${element.id}`} element={element} readOnly={readOnly} onChange={set('tolerance')} />
      )}

      <label className={cx('flex items-center gap-2 text-sm', readOnly && 'text-ink-soft')}>
        <input
          type="checkbox"
          checked={element.locked === true}
          disabled={readOnly}
          onChange={(e) => set('locked')(e.target.checked ? true : undefined)}
          className="size-4 accent-ink"
        />
        Locked <span className="text-xs text-ink-faint">(refine leaves it alone)</span>
      </label>

      {editable && (
        <div className="flex flex-wrap gap-1.5" role="group" aria-label={`Actions on ${elementName(element)}`}>
          <button type="button" className={smallButton()} disabled={index >= count - 1} onClick={() => actions.move(element.id, index + 1)}>
            ← Toward port
          </button>
          <button type="button" className={smallButton()} disabled={index <= 0} onClick={() => actions.move(element.id, index - 1)}>
            Toward load →
          </button>
          <button type="button" className={smallButton()} onClick={() => actions.duplicate(element.id)}>
            Duplicate
          </button>
          <button type="button" className={smallButton('danger')} onClick={() => actions.remove(element.id)}>
            Delete
          </button>
        </div>
      )}
    </section>
  );
}

function LabelField({ label, readOnly, onCommit }: { label: string; readOnly: boolean; onCommit(v: string): void }) {
  const id = useId();
  const [draft, setDraft] = useState<string | null>(null);
  const commit = () => {
    if (draft !== null && draft.trim() !== label) onCommit(draft.trim());
    setDraft(null);
  };
  return (
    <div className="flex flex-col gap-0.5">
      <label htmlFor={id} className="text-xs font-semibold text-ink-soft">
        Label
      </label>
      <input
        id={id}
        type="text"
        value={draft ?? label}
        placeholder="none (the id is shown)"
        readOnly={readOnly}
        maxLength={60}
        className={cx(compactControl(false, readOnly), 'font-sans')}
        onChange={(e) => setDraft(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === 'Enter') commit();
          if (e.key === 'Escape') setDraft(null);
        }}
      />
    </div>
  );
}

function LineFields({
  design,
  element,
  readOnly,
  actions,
}: {
  design: Design;
  element: Extract<Element, { kind: 'line' | 'open-stub' | 'short-stub' }>;
  readOnly: boolean;
  actions: ElementActions;
}) {
  const id = element.id;
  const length = element.length;
  const setLength = (l: Length) => actions.setField(id, 'length', l);
  const modeId = useId();
  const f0 = bandCenterHz(design.band);
  return (
    <div className="flex flex-col gap-2">
      <div className="grid grid-cols-2 gap-2">
        <ValueField
          key={`z0-${id}`}
          label="Impedance Z0 (Ω)"
          value={element.z0}
          unit="Ω"
          rules={{ positive: true }}
          readOnly={readOnly}
          onCommit={(v) => v !== undefined && actions.setField(id, 'z0', v)}
        />
        <ValueField
          key={`loss-${id}`}
          label="Loss (dB/m)"
          value={element.lossDbPerM}
          unit=""
          optional
          placeholder="lossless"
          rules={{ nonNegative: true }}
          readOnly={readOnly}
          onCommit={(v) => actions.setField(id, 'lossDbPerM', v)}
          digits={3}
        />
      </div>
      <div className="flex flex-col gap-0.5">
        <label htmlFor={modeId} className="text-xs font-semibold text-ink-soft">
          Length given as
        </label>
        <select
          id={modeId}
          className={cx(compactControl(false, readOnly), 'font-sans')}
          value={'degrees' in length ? 'degrees' : 'meters'}
          disabled={readOnly}
          onChange={(e: ChangeEvent<HTMLSelectElement>) =>
            setLength(e.target.value === 'degrees' ? lengthInDegrees(length, f0) : lengthInMeters(length, defaultVelocityFactor(design)))
          }
        >
          <option value="degrees">electrical degrees at a frequency</option>
          <option value="meters">metres with a velocity factor</option>
        </select>
      </div>
      {'degrees' in length ? (
        <div className="grid grid-cols-2 gap-2">
          <ValueField
            key={`deg-${id}`}
            label="Length (°)"
            value={length.degrees}
            unit="°"
            rules={{ nonNegative: true }}
            readOnly={readOnly}
            onCommit={(v) => v !== undefined && setLength({ ...length, degrees: v })}
            tuning={{ scale: 'linear', series: null, onTune: (v) => actions.tuneField(id, 'length', { ...length, degrees: v }) }}
          />
          <ValueField
            key={`at-${id}`}
            label="At (Hz)"
            value={length.atHz}
            unit="Hz"
            digits={6}
            rules={{ positive: true }}
            readOnly={readOnly}
            onCommit={(v) => v !== undefined && setLength({ ...length, atHz: v })}
          />
        </div>
      ) : (
        <div className="grid grid-cols-2 gap-2">
          <ValueField
            key={`m-${id}`}
            label="Length (m)"
            value={length.meters}
            unit="m"
            rules={{ nonNegative: true }}
            readOnly={readOnly}
            onCommit={(v) => v !== undefined && setLength({ ...length, meters: v })}
            tuning={{ scale: 'log', series: null, onTune: (v) => actions.tuneField(id, 'length', { ...length, meters: v }) }}
          />
          <ValueField
            key={`vf-${id}`}
            label="Velocity factor"
            value={length.velocityFactor}
            unit=""
            digits={3}
            rules={{ positive: true, max: 1 }}
            readOnly={readOnly}
            onCommit={(v) => v !== undefined && setLength({ ...length, velocityFactor: v })}
          />
        </div>
      )}
    </div>
  );
}

type ToleranceMode = 'none' | 'relative' | 'absolute';

function ToleranceFields({ element, readOnly, onChange }: { element: Element; readOnly: boolean; onChange(t: Tolerance | undefined): void }) {
  const t = element.tolerance;
  const mode: ToleranceMode = !t ? 'none' : t.relative !== undefined ? 'relative' : 'absolute';
  const unit = 'value' in element ? (kindInfo(element.kind).unit ?? '') : '';
  const modeId = useId();
  const distId = useId();
  const canAbsolute = 'value' in element;
  return (
    <fieldset className="flex flex-col gap-2 rounded-md border border-rule/70 px-2 pt-1 pb-2">
      <legend className="px-1 text-xs font-bold text-ink-soft">Tolerance (yield run)</legend>
      <div className="grid grid-cols-2 gap-2">
        <div className="flex flex-col gap-0.5">
          <label htmlFor={modeId} className="text-xs font-semibold text-ink-soft">
            Kind
          </label>
          <select
            id={modeId}
            value={mode}
            disabled={readOnly}
            className={cx(compactControl(false, readOnly), 'font-sans')}
            onChange={(e) => {
              const m = e.target.value as ToleranceMode;
              const dist = t?.distribution ? { distribution: t.distribution } : {};
              if (m === 'none') onChange(undefined);
              else if (m === 'relative') onChange({ relative: 0.05, ...dist });
              else onChange({ absolute: 'value' in element ? Number((element.value * 0.05).toPrecision(2)) : 0, ...dist });
            }}
          >
            <option value="none">none (exact)</option>
            <option value="relative">± percent</option>
            {canAbsolute && <option value="absolute">± {unit}</option>}
          </select>
        </div>
        {mode === 'relative' && t && (
          <ValueField
            label="± %"
            value={(t.relative ?? 0) * 100}
            unit=""
            digits={3}
            rules={{ nonNegative: true, max: 100 }}
            readOnly={readOnly}
            onCommit={(v) => v !== undefined && onChange({ ...t, absolute: undefined, relative: v / 100 })}
          />
        )}
        {mode === 'absolute' && t && (
          <ValueField
            label={`± ${unit}`}
            value={t.absolute ?? 0}
            unit={unit}
            digits={3}
            rules={{ nonNegative: true }}
            readOnly={readOnly}
            onCommit={(v) => v !== undefined && onChange({ ...t, relative: undefined, absolute: v })}
          />
        )}
      </div>
      {t && (
        <div className="flex flex-col gap-0.5">
          <label htmlFor={distId} className="text-xs font-semibold text-ink-soft">
            Spread
          </label>
          <select
            id={distId}
            value={t.distribution ?? 'uniform'}
            disabled={readOnly}
            className={cx(compactControl(false, readOnly), 'font-sans')}
            onChange={(e) => onChange({ ...t, distribution: e.target.value === 'normal' ? 'normal' : undefined })}
          >
            <option value="uniform">uniform within the tolerance</option>
            <option value="normal">normal (tolerance = 3σ)</option>
          </select>
        </div>
      )}
    </fieldset>
  );
}

function TwoPortFields({
  element,
  readOnly,
  actions,
}: {
  element: Extract<Element, { kind: 'two-port' }>;
  readOnly: boolean;
  actions: ElementActions;
}) {
  const [error, setError] = useState<string | null>(null);
  const fileId = useId();
  const summary = twoPortSummary(element.touchstone);
  const onFile = async (e: ChangeEvent<HTMLInputElement>) => {
    const file = e.target.files?.[0];
    e.target.value = '';
    if (!file) return;
    if (file.size > 5_000_000) return setError('That file is over 5 MB; a two-port .s2p is usually far smaller.');
    const text = await file.text();
    try {
      parseTouchstone(text, { ports: 2 });
    } catch (err) {
      return setError(err instanceof TouchstoneError || err instanceof Error ? `${file.name}: ${err.message}` : `${file.name} does not parse`);
    }
    setError(null);
    actions.setFields(element.id, { touchstone: text, ...(element.label ? {} : { label: file.name.replace(/\.s2p$/i, '') }) });
  };
  return (
    <div className="flex flex-col gap-2">
      <p className="text-xs text-ink-soft">S-parameters: {summary}</p>
      {!readOnly && (
        <div className="flex flex-col gap-0.5">
          <label htmlFor={fileId} className="text-xs font-semibold text-ink-soft">
            Open a .s2p file
          </label>
          <input id={fileId} type="file" accept=".s2p,.S2P,text/plain" className="text-xs" onChange={(e) => void onFile(e)} />
          {error && (
            <p role="alert" className="text-xs font-semibold text-coral-deep">
              {error}
            </p>
          )}
        </div>
      )}
      <label className="flex items-center gap-2 text-sm">
        <input
          type="checkbox"
          className="size-4 accent-ink"
          checked={element.flipped === true}
          disabled={readOnly}
          onChange={(e) => actions.setField(element.id, 'flipped', e.target.checked ? true : undefined)}
        />
        Flipped <span className="text-xs text-ink-faint">(port 2 faces the port side)</span>
      </label>
    </div>
  );
}

function twoPortSummary(touchstone: string): string {
  try {
    const f = parseTouchstone(touchstone, { ports: 2 }).frequenciesHz;
    return `${f.length} points, ${frequencyRangeText(f[0], f[f.length - 1])}`;
  } catch (e) {
    return e instanceof Error ? e.message : 'does not parse';
  }
}
