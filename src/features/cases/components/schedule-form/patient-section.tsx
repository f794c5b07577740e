import { format } from 'date-fns';
import { useFormContext } from 'react-hook-form';
import { sexes } from '#shared/schemas/cases.ts';
import { Field, Input, Select } from '@/components/ui/field.tsx';
import { Fieldset } from './fieldset.tsx';
import type { ScheduleFormValues } from './model.ts';

const sexLabels: Record<(typeof sexes)[number], string> = { female: 'Female', male: 'Male', other: 'Other', unknown: 'Not known' };

export function PatientSection() {
  const { register, formState: { errors } } = useFormContext<ScheduleFormValues>();
  const e = errors.patient;
  return (
    <Fieldset legend="Patient">
      <Field label="Hospital number" hint="As printed on the wristband." error={e?.hospitalNumber?.message} required className="md:col-span-2">
        {(p) => <Input {...p} {...register('patient.hospitalNumber')} autoComplete="off" spellCheck={false} className="font-mono tracking-wide md:max-w-sm" />}
      </Field>
      <Field label="Family name" error={e?.familyName?.message} required>
        {(p) => <Input {...p} {...register('patient.familyName')} autoComplete="off" />}
      </Field>
      <Field label="Given name" error={e?.givenName?.message} required>
        {(p) => <Input {...p} {...register('patient.givenName')} autoComplete="off" />}
      </Field>
      <Field label="Date of birth" error={e?.birthDate?.message} required>
        {(p) => <Input {...p} {...register('patient.birthDate')} type="date" max={format(new Date(), 'yyyy-MM-dd')} />}
      </Field>
      <Field label="Sex" error={e?.sex?.message} required>
        {(p) => (
          <Select {...p} {...register('patient.sex')}>
            <option value="">Choose…</option>
            {sexes.map((s) => <option key={s} value={s}>{sexLabels[s]}</option>)}
          </Select>
        )}
      </Field>
    </Fieldset>
  );
}
