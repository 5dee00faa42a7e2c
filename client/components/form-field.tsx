import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes } from 'react';
import { cx } from '../lib/cx';

export const controlClass = (invalid: boolean) =>
  cx(
    'block w-full rounded-lg border bg-card px-3 py-2 text-ink shadow-xs placeholder:text-ink-faint',
    'focus:outline-none focus-visible:outline-3 focus-visible:outline-amber focus-visible:outline-offset-1',
    invalid ? 'border-coral-deep' : 'border-rule hover:border-ink-faint',
  );

interface FieldFrameProps {
  label: string;
  error?: string;
  hint?: ReactNode;
  children: (ids: { id: string; describedBy: string | undefined }) => ReactNode;
  className?: string;
}

/** A label, the control, an optional hint and the field's error, wired together for assistive tech. */
export function FieldFrame({ label, error, hint, children, className }: FieldFrameProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="text-sm font-semibold text-ink">
        {label}
      </label>
      {children({ id, describedBy })}
      {hint && (
        <p id={hintId} className="text-xs text-ink-faint">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="text-sm font-semibold text-coral-deep">
          {error}
        </p>
      )}
    </div>
  );
}

export interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLInputElement>;
}

export function TextField({ label, error, hint, className, ...input }: TextFieldProps) {
  return (
    <FieldFrame label={label} error={error} hint={hint} className={className}>
      {({ id, describedBy }) => (
        <input id={id} aria-invalid={error ? true : undefined} aria-describedby={describedBy} className={controlClass(!!error)} {...input} />
      )}
    </FieldFrame>
  );
}

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLSelectElement>;
  options: ReadonlyArray<{ value: string; label: string }>;
}

export function SelectField({ label, error, hint, className, options, ...select }: SelectFieldProps) {
  return (
    <FieldFrame label={label} error={error} hint={hint} className={className}>
      {({ id, describedBy }) => (
        <select id={id} aria-invalid={error ? true : undefined} aria-describedby={describedBy} className={controlClass(!!error)} {...select}>
          {options.map((option) => (
            <option key={option.value} value={option.value}>
              {option.label}
            </option>
          ))}
        </select>
      )}
    </FieldFrame>
  );
}

/** A message about the whole form (a refused sign-in, a server error), announced when it appears. */
export function FormError({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <p role="alert" className="rounded-lg border border-coral/40 bg-coral-soft px-3 py-2 text-sm font-semibold text-coral-deep">
      {message}
    </p>
  );
}
