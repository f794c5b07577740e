import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Field, Input } from '@/components/ui/field.tsx';
import { errorMessage } from '@/lib/api.ts';
import { signInSchema, useSignIn, type SignInInput } from '../api/sign-in.ts';
import { useNextPath } from '../hooks/use-next-path.ts';

export function SignInForm() {
  const next = useNextPath();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const { register, handleSubmit, formState: { errors } } = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit((values) => signIn.mutate(values, { onSuccess: () => navigate(next, { replace: true }) }));

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      {signIn.error && <Banner tone="danger" title="Not signed in">{errorMessage(signIn.error)}</Banner>}
      <Field label="E-mail address" error={errors.email?.message} required>
        {(p) => <Input {...p} {...register('email')} type="email" autoComplete="username" inputMode="email" autoCapitalize="none" spellCheck={false} />}
      </Field>
      <Field label="Password" error={errors.password?.message} required>
        {(p) => <Input {...p} {...register('password')} type="password" autoComplete="current-password" />}
      </Field>
      <Button type="submit" variant="primary" size="lg" busy={signIn.isPending}>Sign in</Button>
      <Link to="/forgot-password" className="inline-flex min-h-touch items-center self-start font-bold underline underline-offset-4">
        Forgotten your password?
      </Link>
    </form>
  );
}
