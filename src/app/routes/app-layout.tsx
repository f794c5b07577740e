import { NavLink, Outlet, type LoaderFunctionArgs } from 'react-router';
import { can } from '#shared/domain/permissions.ts';
import { Mark } from '@/components/ui/mark.tsx';
import { SignOutButton } from '@/features/auth/components/sign-out-button.tsx';
import { cn } from '@/lib/cn.ts';
import { useOnline } from '@/lib/online.ts';
import { useMe } from '@/lib/session.ts';
import { requireMe } from '../guard.ts';
import { useScreenTheme } from '../theme-scope.ts';

export const loader = (args: LoaderFunctionArgs) => requireMe(args);

const roleWords = { nurse: 'Nurse', endoscopist: 'Endoscopist', supervisor: 'Supervisor', admin: 'Unit administrator' } as const;
const navClass = ({ isActive }: { isActive: boolean }) =>
  cn('inline-flex min-h-touch items-center rounded-control px-4 font-bold no-underline', isActive ? 'bg-primary text-on-primary' : 'text-text hover:bg-sunken');

function ThemeSwitch() {
  const [theme, setTheme] = useScreenTheme();
  const dim = theme === 'dim';
  return (
    <button type="button" role="switch" aria-checked={dim} onClick={() => setTheme(dim ? 'paper' : 'dim')}
      className="inline-flex min-h-touch items-center gap-2 rounded-control border-2 border-line-strong px-3 font-bold">
      <span aria-hidden className={cn('relative h-6 w-11 rounded-full border-2 border-current', dim && 'bg-primary')}>
        <span className={cn('absolute top-0.5 size-4 rounded-full bg-text transition-all', dim ? 'left-5' : 'left-0.5')} />
      </span>
      Dim room
    </button>
  );
}

export function Component() {
  const me = useMe();
  const online = useOnline();
  return (
    <div className="flex min-h-dvh flex-col">
      <header className="border-b-2 border-line bg-surface">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-3 px-4 py-2 sm:px-6">
          <NavLink to="/cases" className="mr-2 inline-flex min-h-touch items-center gap-2 text-text no-underline" aria-label={`Ledgerline, ${me.unit.name}: the day list`}>
            <Mark size={36} />
            <span className="leading-tight">
              <span className="block text-xl font-bold">Ledgerline</span>
              <span className="block text-sm text-muted">{me.unit.name}</span>
            </span>
          </NavLink>
          <nav aria-label="Main" className="flex flex-wrap gap-1">
            <NavLink to="/cases" end className={navClass}>Day list</NavLink>
            <NavLink to="/catalogue" className={navClass}>Catalogue</NavLink>
            {can(me.role, 'unit.manageUsers') && <NavLink to="/admin/invite" className={navClass}>Invite</NavLink>}
          </nav>
          <div className="ml-auto flex flex-wrap items-center gap-3">
            <p className="text-right leading-tight" data-testid="signed-in-user">
              <span className="block font-bold">{me.user.name}</span>
              <span className="text-sm text-muted">{roleWords[me.role]}</span>
            </p>
            <ThemeSwitch />
            <SignOutButton />
          </div>
        </div>
        {!online && (
          <p role="status" className="border-t-2 border-caution-line bg-caution-soft px-4 py-2 text-center font-bold text-caution">
            Offline — showing what this tablet last received. Changes to bookings need the network.
          </p>
        )}
      </header>
      <main className="flex-1">
        <Outlet />
      </main>
    </div>
  );
}
