import { createContext, useCallback, useContext, useMemo, useRef, useState, type ReactNode } from 'react';
import { cn } from '@/lib/cn.ts';

type ToastTone = 'ok' | 'danger' | 'info';
type Toast = { id: number; tone: ToastTone; text: string };
type Notify = (text: string, tone?: ToastTone) => void;

const ToastContext = createContext<Notify | null>(null);

/** Short confirmations at the foot of the screen, read out by screen readers; errors stay until closed. */
export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<Toast[]>([]);
  const next = useRef(1);
  const dismiss = useCallback((id: number) => setToasts((all) => all.filter((t) => t.id !== id)), []);
  const notify = useCallback<Notify>((text, tone = 'ok') => {
    const id = next.current++;
    setToasts((all) => [...all.slice(-2), { id, tone, text }]);
    if (tone !== 'danger') setTimeout(() => dismiss(id), 6000);
  }, [dismiss]);
  const value = useMemo(() => notify, [notify]);
  return (
    <ToastContext.Provider value={value}>
      {children}
      <div aria-live="polite" className="pointer-events-none fixed inset-x-0 bottom-4 z-50 flex flex-col items-center gap-2 px-4">
        {toasts.map((t) => (
          <div
            key={t.id}
            role={t.tone === 'danger' ? 'alert' : 'status'}
            className={cn(
              'pointer-events-auto flex w-full max-w-xl items-center gap-3 rounded-card border-2 px-4 py-2 shadow-card',
              t.tone === 'danger' ? 'border-danger bg-danger-soft' : t.tone === 'ok' ? 'border-ok bg-ok-soft' : 'border-line-strong bg-info-soft',
            )}
          >
            <p className="flex-1 font-bold">{t.text}</p>
            <button type="button" onClick={() => dismiss(t.id)} className="min-h-touch min-w-touch rounded-control font-bold underline" aria-label="Dismiss message">
              Close
            </button>
          </div>
        ))}
      </div>
    </ToastContext.Provider>
  );
}

export function useToast(): Notify {
  const notify = useContext(ToastContext);
  if (!notify) throw new Error('useToast() needs <ToastProvider>');
  return notify;
}
