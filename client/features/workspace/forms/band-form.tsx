/**
 * Band, sweep and goal; and the port side: reference and port impedance, drive power and board.
 * Each form applies its fields in one edit.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { Design } from '../../../../shared/rf/design';
import { bandFormSchema, bandFormValues, portFormSchema, portFormValues, type BandFormValues, type PortFormValues } from './band-form-model';
import type { DesignPatch } from './design-patch';
import { FormButtons, FormSelect, FormText } from './form-controls';

export interface DesignFormProps {
  design: Design;
  editable: boolean;
  onApply(patch: DesignPatch): string | null;
}

function FormMessage({ text }: { text: string | null }) {
  if (!text) return null;
  return (
    <p role="alert" className="text-xs font-semibold text-coral-deep">
      {text}
    </p>
  );
}

export function BandForm({ design, editable, onApply }: DesignFormProps) {
  // The design is re-read on every document update; follow these fields only when they really changed.
  const key = JSON.stringify([design.band, design.sweep, design.goal]);
  const initial = useMemo(() => bandFormValues(design), [key]);
  const form = useForm<BandFormValues, unknown, Pick<Design, 'band' | 'sweep' | 'goal'>>({
    resolver: zodResolver(bandFormSchema),
    defaultValues: initial,
    mode: 'onBlur',
  });
  const { register, handleSubmit, reset, watch, formState } = form;
  const [message, setMessage] = useState<string | null>(null);
  const readOnly = !editable;
  useEffect(() => {
    if (!formState.isDirty) reset(initial);
  }, [initial, formState.isDirty, reset]);

  const submit = handleSubmit((fields) => {
    const error = onApply(fields);
    setMessage(error);
    if (!error) reset(bandFormValues(fields));
  });
  const err = (name: keyof BandFormValues) => formState.errors[name]?.message;
  const goalKind = watch('goalKind');
  return (
    <form onSubmit={(e) => void submit(e)} aria-label="Band, sweep and goal" className="flex flex-col gap-2" noValidate>
      <fieldset className="grid grid-cols-3 gap-2">
        <legend className="col-span-3 mb-1 text-xs font-bold text-ink">Band</legend>
        <FormText label="Start (Hz)" readOnly={readOnly} error={err('bandStart')} {...register('bandStart')} />
        <FormText label="Stop (Hz)" readOnly={readOnly} error={err('bandStop')} {...register('bandStop')} />
        <FormText label="Centre (Hz)" placeholder="middle" readOnly={readOnly} error={err('center')} {...register('center')} />
      </fieldset>
      <fieldset className="grid grid-cols-2 gap-2">
        <legend className="col-span-2 mb-1 text-xs font-bold text-ink">Goal across the band</legend>
        <FormSelect
          label="Measure"
          disabled={readOnly}
          options={[
            { value: 'vswr', label: 'VSWR at most' },
            { value: 'return-loss', label: 'Return loss at least' },
          ]}
          {...register('goalKind')}
        />
        <FormText label={goalKind === 'vswr' ? 'VSWR' : 'Return loss (dB)'} readOnly={readOnly} error={err('goalValue')} {...register('goalValue')} />
      </fieldset>
      <fieldset className="grid grid-cols-2 gap-2">
        <legend className="col-span-2 mb-1 text-xs font-bold text-ink">Sweep</legend>
        <FormText label="Start (Hz)" readOnly={readOnly} error={err('sweepStart')} {...register('sweepStart')} />
        <FormText label="Stop (Hz)" readOnly={readOnly} error={err('sweepStop')} {...register('sweepStop')} />
        <FormText label="Points" inputMode="numeric" readOnly={readOnly} error={err('points')} {...register('points')} />
        <FormSelect
          label="Spacing"
          disabled={readOnly}
          options={[
            { value: 'linear', label: 'linear' },
            { value: 'log', label: 'logarithmic' },
          ]}
          {...register('spacing')}
        />
      </fieldset>
      <FormMessage text={message} />
      {editable && <FormButtons dirty={formState.isDirty} onRevert={() => reset(initial)} />}
    </form>
  );
}

export function PortForm({ design, editable, onApply }: DesignFormProps) {
  const key = JSON.stringify([design.referenceOhms, design.port, design.drive, design.substrate]);
  const initial = useMemo(() => portFormValues(design), [key]);
  const form = useForm<PortFormValues, unknown, Pick<Design, 'referenceOhms' | 'port' | 'drive' | 'substrate'>>({
    resolver: zodResolver(portFormSchema),
    defaultValues: initial,
    mode: 'onBlur',
  });
  const { register, handleSubmit, reset, formState } = form;
  const [message, setMessage] = useState<string | null>(null);
  const readOnly = !editable;
  useEffect(() => {
    if (!formState.isDirty) reset(initial);
  }, [initial, formState.isDirty, reset]);

  const submit = handleSubmit((fields) => {
    // Keep what this form does not show (the copper thickness).
    const substrate = fields.substrate && design.substrate?.copperM !== undefined ? { ...fields.substrate, copperM: design.substrate.copperM } : fields.substrate;
    const error = onApply({ ...fields, substrate });
    setMessage(error);
    if (!error) reset(portFormValues({ ...fields, substrate }));
  });
  const err = (name: keyof PortFormValues) => formState.errors[name]?.message;
  return (
    <form onSubmit={(e) => void submit(e)} aria-label="Port, drive and board" className="flex flex-col gap-2" noValidate>
      <fieldset className="grid grid-cols-3 gap-2">
        <legend className="col-span-3 mb-1 text-xs font-bold text-ink">Impedances</legend>
        <FormText label="Reference Z0 (Ω)" readOnly={readOnly} error={err('reference')} {...register('reference')} />
        <FormText label="Port R (Ω)" placeholder="= Z0" readOnly={readOnly} error={err('portRe')} {...register('portRe')} />
        <FormText label="Port X (Ω)" placeholder="0" readOnly={readOnly} error={err('portIm')} {...register('portIm')} />
      </fieldset>
      <fieldset className="grid grid-cols-3 gap-2">
        <legend className="col-span-3 mb-1 text-xs font-bold text-ink">Drive and board</legend>
        <FormText label="Drive power (W)" placeholder="none" hint="e.g. 100m, 2 W" readOnly={readOnly} error={err('power')} {...register('power')} />
        <FormText label="Board εr" placeholder="none" readOnly={readOnly} error={err('epsilonR')} {...register('epsilonR')} />
        <FormText label="Board height (m)" placeholder="none" hint="e.g. 1.6 mm" readOnly={readOnly} error={err('height')} {...register('height')} />
      </fieldset>
      <FormMessage text={message} />
      {editable && <FormButtons dirty={formState.isDirty} onRevert={() => reset(initial)} />}
    </form>
  );
}
