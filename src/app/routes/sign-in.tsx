import { AuthFrame } from '@/features/auth/components/auth-frame.tsx';
import { SignInForm } from '@/features/auth/components/sign-in-form.tsx';

export function Component() {
  return (
    <AuthFrame title="Sign in" intro="With the address and password of your unit account.">
      <SignInForm />
    </AuthFrame>
  );
}
