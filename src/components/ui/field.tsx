import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { cn } from '@/lib/cn.ts';

/** What a Field hands to its control so the label, hint and error are tied to it. */
export type ControlProps = { id: string; 'aria-invalid': boolean; 'aria-describedby'?: string; 'aria-required'?: boolean };

type FieldProps = {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  required?: boolean;
  className?: string;
  children: (control: ControlProps) => ReactNode;
};

/** A labelled control with an optional hint and an error that names what to fix. */
export function Field({ label, hint, error, required, className, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cn('flex flex-col gap-1.5', className)}>
      <label htmlFor={id} className="text-base font-bold">
        {label}
        {required && <span className="sr-only"> (required)</span>}
      </label>
      {hint && <p id={hintId} className="text-sm text-muted">{hint}</p>}
      {children({ id, 'aria-invalid': Boolean(error), 'aria-describedby': describedBy, 'aria-required': required || undefined })}
      {error && (
        <p id={errorId} className="flex items-start gap-2 text-base font-bold text-danger">
          <span aria-hidden className="mt-1 inline-block size-3 shrink-0 rotate-45 bg-danger" />
          {error}
        </p>
      )}
    </div>
  );
}

export const controlClass =
  'w-full min-h-touch rounded-control border-2 border-line-strong bg-surface px-3 py-2 text-lg text-text ' +
  'placeholder:text-muted aria-invalid:border-danger aria-invalid:border-[3px] disabled:opacity-60';

export const Input = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement>>(function Input({ className, ...rest }, ref) {
  return <input ref={ref} className={cn(controlClass, className)} {...rest} />;
});

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement>>(function Select({ className, children, ...rest }, ref) {
  return (
    <select ref={ref} className={cn(controlClass, 'cursor-pointer pr-10', className)} {...rest}>
      {children}
    </select>
  );
});

export const Textarea = forwardRef<HTMLTextAreaElement, TextareaHTMLAttributes<HTMLTextAreaElement>>(function Textarea({ className, ...rest }, ref) {
  return <textarea ref={ref} className={cn(controlClass, 'min-h-28', className)} {...rest} />;
});
