import { useParams } from 'react-router';
import { AuthFrame } from '@/features/auth/components/auth-frame.tsx';
import { AcceptInvitationForm } from '@/features/auth/components/accept-invitation-form.tsx';

export function Component() {
  const { invitationId = '' } = useParams();
  return (
    <AuthFrame title="Join your unit">
      <AcceptInvitationForm invitationId={invitationId} />
    </AuthFrame>
  );
}
