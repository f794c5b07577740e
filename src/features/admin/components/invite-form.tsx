import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { createInvitationSchema, type CreateInvitationInput } from '#shared/schemas/api-invitations.ts';
import { roles, type Role } from '#shared/schemas/common.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Field, Input } from '@/components/ui/field.tsx';
import { errorMessage } from '@/lib/api.ts';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { cn } from '@/lib/cn.ts';
import { useCreateInvitation, type InviteFormValues } from '../api/create-invitation.ts';

const roleText: Record<Role, { name: string; does: string }> = {
  nurse: { name: 'Nurse', does: 'Schedules cases, runs the time-out, records and closes the record.' },
  endoscopist: { name: 'Endoscopist', does: 'As a nurse, and writes and signs the reports of their own cases.' },
  supervisor: { name: 'Supervisor', does: 'Reviews cases, grades events, exports for meetings; reads the audit log.' },
  admin: { name: 'Unit administrator', does: 'Users, rooms, the device catalogue and the audit log.' },
};

export function InviteForm() {
  const invite = useCreateInvitation();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { register, handleSubmit, reset, setError, watch, formState: { errors } } = useForm<InviteFormValues, unknown, CreateInvitationInput>({
    resolver: zodResolver(createInvitationSchema),
    defaultValues: { email: '', role: 'nurse' },
  });
  const chosen = watch('role');

  const onSubmit = handleSubmit((input) =>
    invite.mutate(input, {
      onSuccess: () => { setSentTo(input.email); reset({ email: '', role: input.role }); },
      onError: (err) => applyServerErrors(err, setError, ['email', 'role']),
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6">
      {sentTo && <Banner tone="ok" title="Invitation sent" role="status">{sentTo} has a link to join, valid for 7 days.</Banner>}
      {invite.error && <Banner tone="danger" title="No invitation sent">{errorMessage(invite.error)}</Banner>}
      <Field label="E-mail address" error={errors.email?.message} required>
        {(p) => <Input {...p} {...register('email')} type="email" inputMode="email" autoCapitalize="none" spellCheck={false} autoComplete="off" />}
      </Field>
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 text-base font-bold">Role in the unit</legend>
        {roles.map((r) => (
          <label key={r} className={cn('flex min-h-touch-lg cursor-pointer items-start gap-3 rounded-control border-2 p-3', chosen === r ? 'border-primary bg-info-soft' : 'border-line bg-surface')}>
            <input type="radio" value={r} {...register('role')} className="mt-1 size-6 accent-[var(--color-primary)]" />
            <span><span className="block font-bold">{roleText[r].name}</span><span className="text-muted">{roleText[r].does}</span></span>
          </label>
        ))}
        {errors.role?.message && <p className="font-bold text-danger">{errors.role.message}</p>}
      </fieldset>
      <Button type="submit" variant="primary" size="lg" busy={invite.isPending} className="self-start min-w-64">Send the invitation</Button>
    </form>
  );
}
