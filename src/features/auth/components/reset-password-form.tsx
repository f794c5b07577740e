import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link, useSearchParams } from 'react-router';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Field, Input } from '@/components/ui/field.tsx';
import { ApiError, errorMessage } from '@/lib/api.ts';
import { newPasswordSchema, PASSWORD_MIN, type NewPasswordInput } from '../api/passwords.ts';
import { useResetPassword } from '../api/reset-password.ts';

export function ResetPasswordForm() {
  const [params] = useSearchParams();
  const token = params.get('token');
  const reset = useResetPassword();
  const { register, handleSubmit, formState: { errors } } = useForm<NewPasswordInput>({ resolver: zodResolver(newPasswordSchema), defaultValues: { password: '', confirm: '' } });

  if (!token || params.get('error')) {
    return (
      <div className="flex flex-col gap-5">
        <Banner tone="danger" title="This link does not work">It is incomplete, used already or more than an hour old. Ask for a new one.</Banner>
        <Link to="/forgot-password" className="inline-flex min-h-touch items-center font-bold underline underline-offset-4">Ask for a new link</Link>
      </div>
    );
  }
  if (reset.isSuccess) {
    return (
      <div className="flex flex-col gap-5">
        <Banner tone="ok" title="Password changed" role="status">Sign in with the new password. Other sessions were signed out.</Banner>
        <Link to="/sign-in" className="inline-flex min-h-touch items-center font-bold underline underline-offset-4">Go to sign-in</Link>
      </div>
    );
  }
  return (
    <form onSubmit={handleSubmit((v) => reset.mutate({ token, password: v.password }))} noValidate className="flex flex-col gap-5">
      {reset.error && (
        <Banner tone="danger" title="Password not changed">
          {reset.error instanceof ApiError && reset.error.status === 400
            ? <>This link does not work any more: it was used already or is more than an hour old. <Link to="/forgot-password" className="font-bold underline">Ask for a new one</Link>.</>
            : errorMessage(reset.error)}
        </Banner>
      )}
      <Field label="New password" hint={`At least ${PASSWORD_MIN} characters. A short sentence is easy to type and hard to guess.`} error={errors.password?.message} required>
        {(p) => <Input {...p} {...register('password')} type="password" autoComplete="new-password" />}
      </Field>
      <Field label="New password again" error={errors.confirm?.message} required>
        {(p) => <Input {...p} {...register('confirm')} type="password" autoComplete="new-password" />}
      </Field>
      <Button type="submit" variant="primary" size="lg" busy={reset.isPending}>Set the new password</Button>
    </form>
  );
}
