import { useFormContext } from 'react-hook-form';
import { parisTypes, procedureTypeLabels, procedureTypes } from '#shared/schemas/cases.ts';
import { Field, Input, Select, Textarea } from '@/components/ui/field.tsx';
import { parisLabel } from '../paris.ts';
import { Fieldset } from './fieldset.tsx';
import type { ScheduleFormValues } from './model.ts';

const toSize = (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v));

export function ProcedureSection() {
  const { register, formState: { errors } } = useFormContext<ScheduleFormValues>();
  return (
    <Fieldset legend="Procedure and lesion">
      <Field label="Procedure" error={errors.procedureType?.message} required className="md:col-span-2">
        {(p) => (
          <Select {...p} {...register('procedureType')}>
            <option value="">Choose…</option>
            {procedureTypes.map((t) => <option key={t} value={t}>{procedureTypeLabels[t]}</option>)}
          </Select>
        )}
      </Field>
      <Field label="Indication" hint="Why the procedure is done, in a line." error={errors.indication?.message} required className="md:col-span-2">
        {(p) => <Textarea {...p} {...register('indication')} rows={2} />}
      </Field>
      <Field label="Lesion site" hint="E.g. gastric antrum, greater curvature." error={errors.lesion?.site?.message} required className="md:col-span-2">
        {(p) => <Input {...p} {...register('lesion.site')} autoComplete="off" />}
      </Field>
      <Field label="Size (mm)" hint="Largest diameter, estimated at endoscopy." error={errors.lesion?.sizeMm?.message} required>
        {(p) => <Input {...p} {...register('lesion.sizeMm', { setValueAs: toSize })} type="number" inputMode="numeric" min={1} max={300} step={1} />}
      </Field>
      <Field label="Paris type" hint="Shape of a superficial lesion." error={errors.lesion?.paris?.message} required>
        {(p) => (
          <Select {...p} {...register('lesion.paris')}>
            <option value="">Choose…</option>
            {parisTypes.map((t) => <option key={t} value={t}>{parisLabel(t)}</option>)}
          </Select>
        )}
      </Field>
    </Fieldset>
  );
}
