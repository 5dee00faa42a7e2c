/**
 * A value typed in engineering notation ("3.3n", "2.2 pF", "4k7", "45°"). Enter or leaving the
 * field commits; Escape goes back to the document's value; a value that does not parse stays in
 * the field with the reason beside it. With `tuning`, ↑/↓ and the mouse wheel step the value live
 * (Shift coarse, Alt fine; E-series steps when a series is chosen).
 */
import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import type { ESeries } from '../../../../shared/rf/eseries';
import { cx } from '../../../lib/cx';
import type { TunableUnit } from './tunable';
import { stepSizeFromModifiers, stepValue, wheelSteps } from './tuning-step';
import { formatValueText, parseValueText, type ParseRules } from './value-text';

export interface ValueFieldProps {
  label: string;
  /** the document's value; undefined shows an empty field (an optional value not set) */
  value: number | undefined;
  unit: TunableUnit;
  rules?: ParseRules;
  /** an empty field means "none" (optional values such as Q) */
  optional?: boolean;
  readOnly?: boolean;
  hint?: string;
  placeholder?: string;
  /** a typed value was committed (undefined: cleared an optional value) */
  onCommit(value: number | undefined): void;
  /** live tuning from keys and wheel; without it the arrows do nothing special */
  tuning?: { scale: 'log' | 'linear'; series: ESeries | null; onTune(value: number): void };
  digits?: number;
  className?: string;
}

export const compactControl = (invalid: boolean, readOnly?: boolean) =>
  cx(
    'numeric block w-full rounded-md border px-2 py-1 text-sm text-ink',
    'focus:outline-none focus-visible:outline-2 focus-visible:outline-amber focus-visible:outline-offset-1',
    readOnly ? 'border-transparent bg-paper-deep/60' : 'bg-card',
    invalid ? 'border-coral-deep' : readOnly ? '' : 'border-rule hover:border-ink-faint',
  );

export function ValueField(props: ValueFieldProps) {
  const { label, value, unit, rules, optional, readOnly, hint, tuning, digits = 4 } = props;
  const id = useId();
  const shown = value === undefined ? '' : formatValueText(value, unit, digits);
  // null: the field shows the document's value (and follows collaborators' edits and tunes)
  const [draft, setDraft] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const text = draft ?? shown;

  const commit = (): boolean => {
    if (draft === null) return true;
    const trimmed = draft.trim();
    if (trimmed === shown.trim()) {
      setDraft(null);
      setError(null);
      return true;
    }
    if (trimmed === '' && optional) {
      setDraft(null);
      setError(null);
      props.onCommit(undefined);
      return true;
    }
    const parsed = parseValueText(trimmed, unit, rules);
    if (!parsed.ok) {
      setError(parsed.message);
      return false;
    }
    setDraft(null);
    setError(null);
    props.onCommit(parsed.value);
    return true;
  };

  const tune = (steps: number, mods: { shiftKey: boolean; altKey: boolean }) => {
    if (!tuning || readOnly || value === undefined) return;
    const next = stepValue(value, steps, { scale: tuning.scale, size: stepSizeFromModifiers(mods), series: tuning.series });
    setDraft(null);
    setError(null);
    if (next !== value) tuning.onTune(next);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (readOnly) return;
    if (e.key === 'Enter') {
      commit();
      e.preventDefault();
    } else if (e.key === 'Escape') {
      setDraft(null);
      setError(null);
      e.preventDefault();
    } else if ((e.key === 'ArrowUp' || e.key === 'ArrowDown') && tuning) {
      tune(e.key === 'ArrowUp' ? 1 : -1, e);
      e.preventDefault();
    }
  };

  // The wheel tunes a focused field; a non-passive listener so the panel does not scroll meanwhile.
  const input = useRef<HTMLInputElement>(null);
  const tuneRef = useRef(tune);
  tuneRef.current = tune;
  const wheelActive = !!tuning && !readOnly;
  useEffect(() => {
    const el = input.current;
    if (!el || !wheelActive) return;
    const onWheel = (e: WheelEvent) => {
      if (document.activeElement !== el) return;
      e.preventDefault();
      tuneRef.current(wheelSteps(e.deltaY), e);
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, [wheelActive]);

  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cx('flex min-w-0 flex-col gap-0.5', props.className)}>
      <label htmlFor={id} className="text-xs font-semibold text-ink-soft">
        {label}
      </label>
      <input
        ref={input}
        id={id}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        value={text}
        placeholder={props.placeholder}
        readOnly={readOnly}
        aria-readonly={readOnly || undefined}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={compactControl(!!error, readOnly)}
        onChange={(e) => setDraft(e.target.value)}
        onBlur={() => void commit()}
        onKeyDown={onKeyDown}
      />
      {hint && !error && (
        <p id={hintId} className="text-[11px] text-ink-faint">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} role="alert" className="text-xs font-semibold text-coral-deep">
          {error}
        </p>
      )}
    </div>
  );
}
