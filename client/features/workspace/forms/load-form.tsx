/**
 * The load: a fixed impedance, an RLC model, or a measured Touchstone .s1p (pasted, or opened from
 * a local file). Apply writes the load in one edit; a measured file whose range the sweep overruns
 * narrows the sweep in the same edit.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useId, useMemo, useState, type ChangeEvent } from 'react';
import { useForm } from 'react-hook-form';
import type { Design, Load } from '../../../../shared/rf/design';
import { FormButtons, FormSelect, FormText } from './form-controls';
import { loadFormSchema, loadFormValues, sweepForMeasured, type LoadFormValues } from './load-form-model';
import type { DesignPatch } from './design-patch';

export interface LoadFormProps {
  design: Design;
  editable: boolean;
  /** writes the fields in one edit; returns the reason when the design would not be valid */
  onApply(patch: DesignPatch): string | null;
}

const KIND_OPTIONS = [
  { value: 'impedance', label: 'Fixed impedance' },
  { value: 'rlc', label: 'RLC model' },
  { value: 'measured', label: 'Measured (Touchstone .s1p)' },
];

export function LoadForm({ design, editable, onApply }: LoadFormProps) {
  // The design is re-read on every document update; follow the load only when it really changed.
  const loadKey = JSON.stringify(design.load);
  const initial = useMemo(() => loadFormValues(JSON.parse(loadKey) as Load), [loadKey]);
  const form = useForm<LoadFormValues, unknown, Load>({ resolver: zodResolver(loadFormSchema), defaultValues: initial, mode: 'onBlur' });
  const { register, handleSubmit, reset, watch, setValue, formState } = form;
  const [message, setMessage] = useState<{ tone: 'error' | 'note'; text: string } | null>(null);
  const fileId = useId();
  const kind = watch('kind');
  const readOnly = !editable;

  // Follow the room while the user has nothing unapplied.
  useEffect(() => {
    if (!formState.isDirty) reset(initial);
  }, [initial, formState.isDirty, reset]);

  const submit = handleSubmit((load) => {
    const patch: DesignPatch = { load };
    let note: string | null = null;
    if (load.kind === 'measured') {
      const fit = sweepForMeasured(load.touchstone, design.sweep, design.band);
      if (!fit.ok) {
        form.setError('touchstone', { message: fit.message });
        return;
      }
      if (fit.sweep) patch.sweep = fit.sweep;
      note = fit.note;
    }
    const error = onApply(patch);
    if (error) setMessage({ tone: 'error', text: error });
    else {
      setMessage(note ? { tone: 'note', text: note } : null);
      reset(loadFormValues(load));
    }
  });

  const onFile = async (e: ChangeEvent<HTMLInputElement>) => {
    const file = e.target.files?.[0];
    e.target.value = '';
    if (!file) return;
    if (file.size > 5_000_000) {
      form.setError('touchstone', { message: `${file.name} is over 5 MB; a .s1p measurement is usually far smaller` });
      return;
    }
    setValue('touchstone', await file.text(), { shouldDirty: true, shouldValidate: true });
    setValue('fileName', file.name, { shouldDirty: true });
  };

  const err = (name: keyof LoadFormValues) => formState.errors[name]?.message;
  return (
    <form onSubmit={(e) => void submit(e)} aria-label="Load" className="flex flex-col gap-2" noValidate>
      {design.load.kind === 'table' && (
        <p className="text-xs text-ink-soft">The load is a table of {design.load.points.length} impedances; apply another load here to replace it.</p>
      )}
      <FormSelect label="Load model" options={KIND_OPTIONS} disabled={readOnly} {...register('kind')} />
      {kind === 'impedance' && (
        <div className="grid grid-cols-2 gap-2">
          <FormText label="Resistance R (Ω)" readOnly={readOnly} error={err('re')} {...register('re')} />
          <FormText label="Reactance X (Ω)" readOnly={readOnly} error={err('im')} {...register('im')} />
        </div>
      )}
      {kind === 'rlc' && (
        <>
          <FormSelect
            label="Topology"
            disabled={readOnly}
            options={[
              { value: 'series', label: 'Series: Z = R + jωL + 1/(jωC)' },
              { value: 'parallel', label: 'Parallel: Y = 1/R + 1/(jωL) + jωC' },
            ]}
            {...register('topology')}
          />
          <div className="grid grid-cols-3 gap-2">
            <FormText label="R (Ω)" readOnly={readOnly} error={err('r')} {...register('r')} />
            <FormText label="L (H)" placeholder="none" readOnly={readOnly} error={err('l')} {...register('l')} />
            <FormText label="C (F)" placeholder="none" readOnly={readOnly} error={err('c')} {...register('c')} />
          </div>
          <p className="text-[11px] text-ink-faint">Leave L or C empty to leave it out of the model. Values like 1.5n, 2 pF, 4k7.</p>
        </>
      )}
      {kind === 'measured' && (
        <>
          {!readOnly && (
            <div className="flex flex-col gap-0.5">
              <label htmlFor={fileId} className="text-xs font-semibold text-ink-soft">
                Open a .s1p file from this computer
              </label>
              <input id={fileId} type="file" accept=".s1p,.S1P,text/plain" className="text-xs" onChange={(e) => void onFile(e)} />
            </div>
          )}
          <div className="flex flex-col gap-0.5">
            <label htmlFor={`${fileId}-text`} className="text-xs font-semibold text-ink-soft">
              Touchstone text {watch('fileName') ? `(${watch('fileName')})` : ''}
            </label>
            <textarea
              id={`${fileId}-text`}
              rows={6}
              readOnly={readOnly}
              spellCheck={false}
              aria-invalid={err('touchstone') ? true : undefined}
              aria-describedby={err('touchstone') ? `${fileId}-err` : undefined}
              placeholder={'! or paste here\n# GHz S MA R 50\n2.40 0.62 -48.1\n...'}
              className="numeric block w-full rounded-md border border-rule bg-card px-2 py-1 text-[11px] text-ink"
              {...register('touchstone')}
            />
            {err('touchstone') && (
              <p id={`${fileId}-err`} className="text-xs font-semibold text-coral-deep">
                {err('touchstone')}
              </p>
            )}
          </div>
        </>
      )}
      {message && (
        <p role={message.tone === 'error' ? 'alert' : 'status'} className={message.tone === 'error' ? 'text-xs font-semibold text-coral-deep' : 'text-xs text-teal-deep'}>
          {message.text}
        </p>
      )}
      {editable && <FormButtons dirty={formState.isDirty} onRevert={() => reset(initial)} applyLabel="Apply load" />}
    </form>
  );
}
