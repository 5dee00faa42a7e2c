/** Compact labelled controls for the side panel's forms, wired for react-hook-form and screen readers. */
import { useId, type ReactNode, type Ref, type SelectHTMLAttributes, type InputHTMLAttributes } from 'react';
import { cx } from '../../../lib/cx';
import { compactControl } from '../value/value-field';

interface FrameProps {
  label: string;
  error?: string;
  hint?: ReactNode;
  className?: string;
  children(ids: { id: string; describedBy: string | undefined }): ReactNode;
}

function Frame({ label, error, hint, className, children }: FrameProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  return (
    <div className={cx('flex min-w-0 flex-col gap-0.5', className)}>
      <label htmlFor={id} className="text-xs font-semibold text-ink-soft">
        {label}
      </label>
      {children({ id, describedBy: [hintId, errorId].filter(Boolean).join(' ') || undefined })}
      {hint && !error && (
        <p id={hintId} className="text-[11px] text-ink-faint">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="text-xs font-semibold text-coral-deep">
          {error}
        </p>
      )}
    </div>
  );
}

export interface FormTextProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLInputElement>;
}

export function FormText({ label, error, hint, className, readOnly, ...input }: FormTextProps) {
  return (
    <Frame label={label} error={error} hint={hint} className={className}>
      {({ id, describedBy }) => (
        <input
          id={id}
          type="text"
          autoComplete="off"
          spellCheck={false}
          readOnly={readOnly}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className={compactControl(!!error, readOnly)}
          {...input}
        />
      )}
    </Frame>
  );
}

export interface FormSelectProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  error?: string;
  options: ReadonlyArray<{ value: string; label: string }>;
  ref?: Ref<HTMLSelectElement>;
}

export function FormSelect({ label, error, options, className, disabled, ...select }: FormSelectProps) {
  return (
    <Frame label={label} error={error} className={className}>
      {({ id, describedBy }) => (
        <select
          id={id}
          disabled={disabled}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className={cx(compactControl(!!error, disabled), 'font-sans')}
          {...select}
        >
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </Frame>
  );
}

/** Apply / Revert for a form that writes to the room; absent for observers. */
export function FormButtons({ dirty, busy, onRevert, applyLabel = 'Apply' }: { dirty: boolean; busy?: boolean; onRevert(): void; applyLabel?: string }) {
  return (
    <div className="flex items-center gap-2">
      <button type="submit" disabled={!dirty || busy} className="rounded-md bg-ink px-3 py-1 text-xs font-semibold text-paper hover:bg-ink-soft disabled:opacity-50">
        {applyLabel}
      </button>
      <button
        type="button"
        disabled={!dirty}
        onClick={onRevert}
        className="rounded-md border border-rule bg-card px-3 py-1 text-xs font-semibold text-ink hover:bg-paper disabled:opacity-50"
      >
        Revert
      </button>
      {dirty && <span className="text-[11px] text-ink-faint">not applied yet</span>}
    </div>
  );
}
