import type { Ref, TextareaHTMLAttributes } from 'react';
import { controlClass, FieldFrame } from '../../../components/form-field';

export interface NoteTextAreaProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: string;
  error?: string;
  hint?: string;
  ref?: Ref<HTMLTextAreaElement>;
}

export function NoteTextArea({ label, error, hint, className, rows = 3, ...rest }: NoteTextAreaProps) {
  return (
    <FieldFrame label={label} error={error} hint={hint} className={className}>
      {({ id, describedBy }) => (
        <textarea id={id} rows={rows} aria-invalid={error ? true : undefined} aria-describedby={describedBy} className={controlClass(!!error)} {...rest} />
      )}
    </FieldFrame>
  );
}
