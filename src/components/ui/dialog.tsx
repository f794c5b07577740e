import { useEffect, useRef, type ReactNode } from 'react';
import { cn } from '@/lib/cn.ts';

type Props = {
  open: boolean;
  onClose: () => void;
  title: ReactNode;
  children: ReactNode;
  /** A bottom sheet on the tablet (for quick choices) or a centred dialog (for confirmations). */
  placement?: 'center' | 'sheet';
};

/**
 * The browser's own modal <dialog>: focus is trapped, Escape closes it and the rest of the page is
 * inert, with nothing of ours to get wrong.
 */
export function Dialog({ open, onClose, title, children, placement = 'center' }: Props) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    if (open && !el.open) {
      if (typeof el.showModal === 'function') el.showModal();
      else el.setAttribute('open', '');
    } else if (!open && el.open) {
      if (typeof el.close === 'function') el.close();
      else el.removeAttribute('open');
    }
  }, [open]);
  return (
    <dialog
      ref={ref}
      onClose={onClose}
      onCancel={(e) => { e.preventDefault(); onClose(); }}
      aria-labelledby="dialog-title"
      className={cn(
        'bg-surface text-text shadow-card backdrop:bg-[rgb(0_0_0/0.55)] max-w-[min(40rem,calc(100vw-2rem))] w-full border-2 border-line-strong',
        placement === 'sheet' ? 'mx-auto mb-0 mt-auto rounded-t-card p-6' : 'm-auto rounded-card p-6',
      )}
    >
      {open && (
        <>
          <h2 id="dialog-title" className="mb-4 text-2xl font-bold">{title}</h2>
          {children}
        </>
      )}
    </dialog>
  );
}
