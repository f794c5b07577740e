import { cn } from '@/lib/cn.ts';

/** The product's standing caution (PRODUCT.md, Cautions shown in the product), on every clinical screen. */
export const CAUTION_TEXT =
  'Ledgerline records what happened; it gives no clinical advice. Counts, times and grades must be checked by the team before they are signed. Local policy, law and licensed practice take precedence.';

export function Caution({ className, compact = false }: { className?: string; compact?: boolean }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      data-caution
      className={cn('flex gap-3 rounded-control border-2 border-dashed border-caution-line bg-caution-soft text-caution', compact ? 'px-3 py-2 text-sm' : 'px-4 py-3 text-base', className)}
    >
      <span aria-hidden className="font-bold">△</span>
      <p>{CAUTION_TEXT}</p>
    </aside>
  );
}
