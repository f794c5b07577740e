import { memo, type PointerEvent, type MouseEvent } from 'react';
import { cn } from '@/lib/cn.ts';
import { primaryButtons, tapGroups, type TapButton } from '../vocabulary.ts';

type Props = {
  onTap: (button: TapButton) => void;
  /** The record is closed (signed out) or the case cannot be recorded on this tablet. */
  disabled?: boolean;
};

/**
 * The pad of tap buttons. A tap counts on pointerdown, not on click: with gloves a finger often slides
 * a little before it lifts, which a click would drop, and the time written is the moment of touch.
 * Keyboard users get the same through the click that Enter or Space fire (`detail === 0`); a click that
 * follows a pointerdown (`detail ≥ 1`) is the same tap and is ignored.
 */
export const TapPad = memo(function TapPad({ onTap, disabled = false }: Props) {
  return (
    // Contained: nothing in the pad changes on a tap, so the tap's frame never lays it out or repaints it.
    <div className="flex min-h-0 flex-col gap-2.5 contain-content" role="group" aria-label="Record an event">
      <div className="grid grid-cols-5 gap-2.5">
        {primaryButtons.map((btn) => <PadButton key={btn.key} button={btn} onTap={onTap} disabled={disabled} />)}
      </div>
      {padRows.map((row) => (
        <section key={row.key} aria-label={row.title} className="grid grid-cols-[6.5rem_1fr] items-stretch gap-2.5">
          <h3 className="flex items-center text-sm font-bold uppercase tracking-wide text-muted">{row.title}</h3>
          <div className="grid auto-cols-fr grid-flow-col gap-2.5">
            {row.buttons.map((btn) => <PadButton key={btn.key} button={btn} onTap={onTap} disabled={disabled} />)}
          </div>
        </section>
      ))}
    </div>
  );
});

/** Closure and specimen share one row: each has two buttons, and the pad must fit a landscape screen. */
const padRows = (() => {
  const byKey = new Map(tapGroups.map((g) => [g.key, g]));
  const closure = byKey.get('closure')!;
  const specimen = byKey.get('specimen')!;
  return [
    ...tapGroups.filter((g) => g.key !== 'closure' && g.key !== 'specimen'),
  ].flatMap((g) => (g.key === 'devices'
    ? [g, { key: 'closure-specimen', title: 'Closure · specimen', buttons: [...closure.buttons, ...specimen.buttons] }]
    : [g]));
})();

const tones: Record<string, string> = {
  bleed: 'border-danger bg-danger-soft text-text active:bg-sunken',
  haemostasis: 'border-ok bg-ok-soft text-text active:bg-sunken',
};

const PadButton = memo(function PadButton({ button, onTap, disabled }: { button: TapButton; onTap: (b: TapButton) => void; disabled: boolean }) {
  const onPointerDown = (e: PointerEvent<HTMLButtonElement>) => {
    if (!e.isPrimary || e.button !== 0) return;
    onTap(button);
  };
  const onClick = (e: MouseEvent<HTMLButtonElement>) => {
    if (e.detail === 0) onTap(button);
  };
  const primary = button.size === 'primary';
  return (
    <button
      type="button"
      data-tap={button.key}
      disabled={disabled}
      onPointerDown={onPointerDown}
      onClick={onClick}
      onContextMenu={(e) => e.preventDefault()}
      className={cn(
        'flex touch-manipulation select-none flex-col items-center justify-center rounded-control border-2 px-2 text-center font-bold leading-tight',
        // Pressed: a colour change only (no transform or filter, which cost a repaint of their own).
        'disabled:cursor-not-allowed disabled:opacity-50',
        primary ? 'min-h-24 text-xl' : 'h-touch-lg text-base',
        primary ? (tones[button.key] ?? 'border-primary bg-primary text-on-primary active:bg-primary-hover') : 'border-line-strong bg-surface text-text active:bg-sunken',
      )}
    >
      <span>{button.label}</span>
      {button.hint && <span className="mt-0.5 text-xs font-normal text-muted">{button.hint}</span>}
    </button>
  );
});
