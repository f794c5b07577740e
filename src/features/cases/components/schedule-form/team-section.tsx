import { Controller, useFormContext } from 'react-hook-form';
import { sedationTypeLabels, sedationTypes, type Member, type Room } from '#shared/schemas/cases.ts';
import { Field, Input, Select } from '@/components/ui/field.tsx';
import { Fieldset } from './fieldset.tsx';
import { fromLocalInput, toLocalInput, type ScheduleFormValues } from './model.ts';

type Props = { rooms: Room[]; endoscopists: Member[]; nurses: Member[] };

export function TeamSection({ rooms, endoscopists, nurses }: Props) {
  const { register, control, formState: { errors } } = useFormContext<ScheduleFormValues>();
  return (
    <Fieldset legend="Room, time and team">
      <Field label="Room" error={errors.roomId?.message} required>
        {(p) => (
          <Select {...p} {...register('roomId')}>
            <option value="">Choose…</option>
            {rooms.map((r) => <option key={r.id} value={r.id}>{r.name}</option>)}
          </Select>
        )}
      </Field>
      <Field label="Planned start" hint="Local time on this tablet." error={errors.scheduledAt?.message} required>
        {(p) => (
          <Controller
            control={control}
            name="scheduledAt"
            render={({ field }) => (
              <Input {...p} ref={field.ref} name={field.name} onBlur={field.onBlur} type="datetime-local"
                value={toLocalInput(field.value)} onChange={(ev) => field.onChange(fromLocalInput(ev.target.value))} />
            )}
          />
        )}
      </Field>
      <Field label="Sedation" error={errors.sedation?.message} required className="md:col-span-2">
        {(p) => (
          <Select {...p} {...register('sedation')}>
            <option value="">Choose…</option>
            {sedationTypes.map((s) => <option key={s} value={s}>{sedationTypeLabels[s]}</option>)}
          </Select>
        )}
      </Field>
      <Field label="Endoscopist" error={errors.endoscopistId?.message} required>
        {(p) => (
          <Select {...p} {...register('endoscopistId')}>
            <option value="">Choose…</option>
            {endoscopists.map((m) => <option key={m.userId} value={m.userId}>{m.name}</option>)}
          </Select>
        )}
      </Field>
      <Field label="Assisting nurse" error={errors.nurseId?.message} required>
        {(p) => (
          <Select {...p} {...register('nurseId')}>
            <option value="">Choose…</option>
            {nurses.map((m) => <option key={m.userId} value={m.userId}>{m.name}</option>)}
          </Select>
        )}
      </Field>
    </Fieldset>
  );
}
