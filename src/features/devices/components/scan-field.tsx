import { useCallback, useEffect, useId, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import type { CatalogueItem } from '#shared/schemas/catalogue.ts';
import { catalogueItemTypeLabels } from '#shared/schemas/catalogue.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Input } from '@/components/ui/field.tsx';
import { cn } from '@/lib/cn.ts';
import { useBarcodeDetector } from '../hooks/use-barcode-detector.ts';
import { GS_TEXT, itemName, readScan, showSeparators, type ScanReading } from '../scan.ts';
import { keyToChar, WedgeDetector } from '../wedge.ts';
import { CameraScan } from './camera-scan.tsx';

export type ConfirmedScan = Extract<ScanReading, { ok: true }>;

type Props = {
  catalogue: CatalogueItem[];
  onConfirm: (scan: ConfirmedScan) => void;
  label?: string;
  /** The day expiry is judged against (today by default). */
  today?: Date;
  busy?: boolean;
  autoFocus?: boolean;
  /** Inside a narrow sheet (the capture screen's): shorter words, and the reading scrolled into view. */
  compact?: boolean;
};

const editable = (el: Element | null) => Boolean(el && (el.closest('input, textarea, select, [contenteditable="true"]')));

/**
 * One field for every way a device label arrives: typed, pasted, a hand-held scanner acting as a
 * keyboard (even when the field is not focused), or the camera where the browser can read codes. The
 * reading and its warnings are shown before anything is recorded; the nurse confirms.
 */
export function ScanField({ catalogue, onConfirm, label = 'Device label (scan or type)', today, busy, autoFocus, compact = false }: Props) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [text, setText] = useState('');
  const [reading, setReading] = useState<ScanReading | null>(null);
  const [camera, setCamera] = useState(false);
  const detector = useBarcodeDetector();
  const result = useRef<HTMLDivElement>(null);
  // The reading and its warnings must be seen before the nurse confirms: bring them into view in a scrolled sheet.
  useEffect(() => { if (reading) result.current?.scrollIntoView?.({ block: 'start' }); }, [reading]);

  const read = useCallback((value: string) => {
    if (!value.trim()) return;
    setReading(readScan(value, catalogue, today));
  }, [catalogue, today]);

  // A scanner typing while nothing editable has focus (the nurse just picked the tablet up): catch the burst.
  useEffect(() => {
    const wedge = new WedgeDetector();
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (editable(document.activeElement)) return;
      const code = wedge.feed(e, e.timeStamp || performance.now());
      if (code) { setText(showSeparators(code)); read(code); }
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [read]);

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    const c = keyToChar(e);
    if (c === 'end') { e.preventDefault(); read(text); return; }
    if (c === '\u001d') {
      // An input cannot hold what the key would type; write the separator as text at the caret.
      e.preventDefault();
      const el = e.currentTarget;
      const start = el.selectionStart ?? text.length;
      const end = el.selectionEnd ?? text.length;
      const next = `${text.slice(0, start)}${GS_TEXT}${text.slice(end)}`;
      setText(next);
      setReading(null);
      requestAnimationFrame(() => el.setSelectionRange(start + GS_TEXT.length, start + GS_TEXT.length));
    }
  };

  const again = () => { setText(''); setReading(null); input.current?.focus(); };
  const onCamera = useCallback((raw: string) => { setCamera(false); setText(showSeparators(raw)); read(raw); }, [read]);

  return (
    <div className="flex flex-col gap-3" data-testid="scan-field">
      <div className="flex flex-col gap-1.5">
        <label htmlFor={id} className="text-base font-bold">{label}</label>
        <p id={`${id}-hint`} className="text-sm text-muted">{compact ? `GS1 or HIBC; ${GS_TEXT} for a separator.` : `GS1 or HIBC. A group separator can be typed as ${GS_TEXT}.`}</p>
        <div className="flex flex-wrap gap-2">
          <Input ref={input} id={id} aria-describedby={`${id}-hint`} value={text} autoFocus={autoFocus} autoComplete="off" autoCapitalize="off" spellCheck={false}
            className={cn('min-w-0 flex-1 font-mono', compact ? 'basis-40' : 'basis-64')} onKeyDown={onKeyDown} onChange={(e) => { setText(e.target.value); setReading(null); }} />
          <Button variant="primary" onClick={() => read(text)} disabled={!text.trim()} aria-label="Read the code">{compact ? 'Read' : 'Read the code'}</Button>
          {detector && !camera && <Button onClick={() => setCamera(true)} aria-label="Use the camera">{compact ? 'Camera' : 'Use the camera'}</Button>}
        </div>
      </div>
      {camera && detector && <CameraScan detector={detector} onDetected={onCamera} onClose={() => setCamera(false)} />}
      <div ref={result} className="flex flex-col gap-3 empty:hidden">
      {reading && !reading.ok && (
        <Banner tone="danger" title={reading.checkFailed ? 'The code fails its check: misread or damaged' : 'The code could not be read'}>
          <p>{reading.error}</p>
          <Button className="mt-2" onClick={again}>Scan again</Button>
        </Banner>
      )}
      {reading?.ok && <Reading reading={reading} busy={busy} compact={compact} onConfirm={() => onConfirm(reading)} onAgain={again} />}
      </div>
    </div>
  );
}

function Reading({ reading, busy, compact, onConfirm, onAgain }: { reading: ConfirmedScan; busy?: boolean; compact: boolean; onConfirm: () => void; onAgain: () => void }) {
  const { identifier: d, item, warnings } = reading;
  const facts = useMemo(() => [
    d.gtin && ['GTIN', d.gtin],
    d.labeler && ['HIBC labeler / product', `${d.labeler} / ${d.product ?? '—'}`],
    ['Lot', d.lot ?? '—'],
    d.serial && ['Serial', d.serial],
    ['Expiry', d.expiry ?? '—'],
    d.productionDate && ['Made', d.productionDate],
  ].filter((f): f is [string, string] => Array.isArray(f)), [d]);
  const expired = warnings.some((w) => w.code === 'expired');
  return (
    <section aria-label="What the code says" className={cn('flex flex-col rounded-card border-2 border-line-strong bg-surface', compact ? 'gap-2 p-3' : 'gap-3 p-4')} data-testid="scan-reading">
      {/* Warnings first: they are what must be read before anything is recorded. */}
      {warnings.map((w) => (
        <Banner key={w.code} tone={w.code === 'expired' ? 'danger' : 'caution'} role="alert" title={w.code === 'expired' ? 'Expired item' : w.code === 'not_in_catalogue' ? 'Not in the catalogue' : 'Out of use'}>
          {w.message}
        </Banner>
      ))}
      <div>
        <p className={cn('font-bold', compact ? 'text-lg' : 'text-xl')}>{item ? itemName(item) : 'Not in the catalogue'}</p>
        {item && <p className="text-sm text-muted">{catalogueItemTypeLabels[item.type]}</p>}
      </div>
      <dl className={compact ? 'flex flex-wrap gap-x-4 gap-y-1' : 'grid grid-cols-[auto_1fr] gap-x-4 gap-y-1'}>
        {facts.map(([k, v]) => (
          <div key={k} className={compact ? 'flex gap-1.5' : 'contents'}>
            <dt className="font-bold text-muted">{k}</dt>
            <dd className={k === 'Expiry' && expired ? 'font-bold text-danger' : undefined}>{v}</dd>
          </div>
        ))}
      </dl>
      <div className="flex flex-wrap gap-2">
        <Button variant={expired ? 'danger' : 'primary'} size={compact ? 'md' : 'lg'} busy={busy} onClick={onConfirm}>
          {warnings.length ? 'Record it anyway' : 'Record this device'}
        </Button>
        <Button size={compact ? 'md' : 'lg'} onClick={onAgain}>Scan again</Button>
      </div>
    </section>
  );
}
