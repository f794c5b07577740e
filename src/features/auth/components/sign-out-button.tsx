import { Button } from '@/components/ui/button.tsx';
import { useSignOut } from '../api/sign-out.ts';

export function SignOutButton() {
  const signOut = useSignOut();
  return (
    <Button variant="secondary" busy={signOut.isPending} onClick={() => signOut.mutate()}>
      Sign out
    </Button>
  );
}
