import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router';
import type { InvitationPublic } from '#shared/schemas/api-invitations.ts';
import type { Role } from '#shared/schemas/common.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Field, Input } from '@/components/ui/field.tsx';
import { Loading } from '@/components/ui/page.tsx';
import { ApiError, errorMessage } from '@/lib/api.ts';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { meQueryOptions } from '@/lib/session.ts';
import { acceptInvitationFormSchema, useAcceptAsNewUser, useAcceptAsSignedIn, type AcceptInvitationFormInput } from '../api/accept-invitation.ts';
import { useInvitation } from '../api/get-invitation.ts';
import { PASSWORD_MIN } from '../api/passwords.ts';

const roleWords: Record<Role, string> = { nurse: 'nurse', endoscopist: 'endoscopist', supervisor: 'supervisor (quality lead)', admin: 'unit administrator' };

const closedWords: Record<Exclude<InvitationPublic['status'], 'pending'>, string> = {
  accepted: 'It has been accepted already.',
  rejected: 'It was declined.',
  canceled: 'It was withdrawn.',
  expired: 'It has expired.',
};

export function AcceptInvitationForm({ invitationId }: { invitationId: string }) {
  const invitation = useInvitation(invitationId);
  const session = useQuery({ ...meQueryOptions(), retry: false });
  const asNew = useAcceptAsNewUser();
  const asSignedIn = useAcceptAsSignedIn();
  const navigate = useNavigate();
  const { register, handleSubmit, setError, formState: { errors } } = useForm<AcceptInvitationFormInput>({
    resolver: zodResolver(acceptInvitationFormSchema),
    defaultValues: { name: '', password: '', confirm: '' },
  });

  if (invitation.isPending) return <Loading label="Opening the invitation" />;
  if (invitation.error) {
    const gone = invitation.error instanceof ApiError && (invitation.error.isNotFound || invitation.error.status === 400);
    return <Banner tone="danger" title={gone ? 'Invitation not found' : 'The invitation could not be opened'}>{gone ? 'The link may be incomplete, or the invitation withdrawn. Ask your unit administrator for a new one.' : errorMessage(invitation.error)}</Banner>;
  }
  const inv = invitation.data;
  if (inv.status !== 'pending') {
    return (
      <div className="flex flex-col gap-5">
        <Banner tone="caution" title="This invitation is no longer open">{closedWords[inv.status]} Sign in, or ask your unit administrator for a new one.</Banner>
        <Link to="/cases" className="inline-flex min-h-touch items-center self-start font-bold underline underline-offset-4">Open Ledgerline</Link>
      </div>
    );
  }
  const done = () => navigate('/cases', { replace: true });
  const onSubmit = handleSubmit((v) =>
    asNew.mutate({ invitationId, name: v.name, password: v.password }, { onSuccess: done, onError: (err) => applyServerErrors(err, setError, ['name', 'password']) }),
  );
  const signedInAs = session.data?.user;

  return (
    <div className="flex flex-col gap-5">
      <Banner tone="info">
        Join <strong>{inv.unit.name}{inv.unit.hospital ? `, ${inv.unit.hospital}` : ''}</strong> as {roleWords[inv.role]}, with the address <strong>{inv.email}</strong>.
      </Banner>
      {signedInAs && signedInAs.email.toLowerCase() === inv.email.toLowerCase() ? (
        <>
          {asSignedIn.error && <Banner tone="danger" title="Not joined yet">{errorMessage(asSignedIn.error)}</Banner>}
          <Button variant="primary" size="lg" busy={asSignedIn.isPending} onClick={() => asSignedIn.mutate(invitationId, { onSuccess: done })}>
            Join as {signedInAs.name}
          </Button>
        </>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
          {asNew.error && <Banner tone="danger" title="Not joined yet">{errorMessage(asNew.error)}</Banner>}
          <Field label="Your name" hint="As it should appear on records, e.g. Sofia Marin." error={errors.name?.message} required>
            {(p) => <Input {...p} {...register('name')} autoComplete="name" />}
          </Field>
          <Field label="Choose a password" hint={`At least ${PASSWORD_MIN} characters.`} error={errors.password?.message} required>
            {(p) => <Input {...p} {...register('password')} type="password" autoComplete="new-password" />}
          </Field>
          <Field label="Password again" error={errors.confirm?.message} required>
            {(p) => <Input {...p} {...register('confirm')} type="password" autoComplete="new-password" />}
          </Field>
          <Button type="submit" variant="primary" size="lg" busy={asNew.isPending}>Join the unit</Button>
          <Link to={`/sign-in?next=${encodeURIComponent(`/invite/${invitationId}`)}`} className="inline-flex min-h-touch items-center self-start font-bold underline underline-offset-4">
            I have an account already: sign in first
          </Link>
        </form>
      )}
    </div>
  );
}
