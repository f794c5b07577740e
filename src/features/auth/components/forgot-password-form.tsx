import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Field, Input } from '@/components/ui/field.tsx';
import { errorMessage } from '@/lib/api.ts';
import { requestResetSchema, useRequestPasswordReset, type RequestResetInput } from '../api/request-password-reset.ts';

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const { register, handleSubmit, getValues, formState: { errors } } = useForm<RequestResetInput>({ resolver: zodResolver(requestResetSchema), defaultValues: { email: '' } });

  if (request.isSuccess) {
    return (
      <div className="flex flex-col gap-5">
        <Banner tone="ok" title="Check your mail" role="status">
          If {getValues('email')} has an account, a link to choose a new password is on its way. It works once, for one hour.
        </Banner>
        <Link to="/sign-in" className="inline-flex min-h-touch items-center font-bold underline underline-offset-4">Back to sign-in</Link>
      </div>
    );
  }
  return (
    <form onSubmit={handleSubmit((v) => request.mutate(v))} noValidate className="flex flex-col gap-5">
      {request.error && <Banner tone="danger" title="The link was not sent">{errorMessage(request.error)}</Banner>}
      <Field label="E-mail address" error={errors.email?.message} required>
        {(p) => <Input {...p} {...register('email')} type="email" autoComplete="username" inputMode="email" autoCapitalize="none" spellCheck={false} />}
      </Field>
      <Button type="submit" variant="primary" size="lg" busy={request.isPending}>Send the reset link</Button>
      <Link to="/sign-in" className="inline-flex min-h-touch items-center self-start font-bold underline underline-offset-4">Back to sign-in</Link>
    </form>
  );
}
