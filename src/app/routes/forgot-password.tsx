import { AuthFrame } from '@/features/auth/components/auth-frame.tsx';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form.tsx';

export function Component() {
  return (
    <AuthFrame title="Forgotten password" intro="We send a link to your address to choose a new one.">
      <ForgotPasswordForm />
    </AuthFrame>
  );
}
