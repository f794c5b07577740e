import { AuthFrame } from '@/features/auth/components/auth-frame.tsx';
import { ResetPasswordForm } from '@/features/auth/components/reset-password-form.tsx';

export function Component() {
  return (
    <AuthFrame title="Choose a new password">
      <ResetPasswordForm />
    </AuthFrame>
  );
}
