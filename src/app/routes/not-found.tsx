import { Link, useLocation } from 'react-router';
import { buttonClass } from '@/components/ui/button.tsx';
import { Mark } from '@/components/ui/mark.tsx';

export function Component() {
  const { pathname } = useLocation();
  return (
    <main className="mx-auto flex max-w-2xl flex-col items-start gap-6 px-4 py-12">
      <Mark size={56} />
      <h1 className="text-3xl font-bold">Nothing at this address</h1>
      <p className="text-lg">There is no screen at <code className="rounded bg-sunken px-2 py-0.5 font-mono">{pathname}</code>. The link may be mistyped or out of date.</p>
      <Link to="/cases" className={buttonClass('primary', 'lg')}>Go to the day list</Link>
    </main>
  );
}
