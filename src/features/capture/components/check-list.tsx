import { cn } from '@/lib/cn.ts';
import { Input } from '@/components/ui/field.tsx';
import { answerLabels, type CheckAnswer, type CheckAnswers, type CheckItem } from '../checklists.ts';

const answers: CheckAnswer[] = ['yes', 'no', 'not_applicable'];

/** The items of a room check, each with yes / no / not applicable as big chips and an optional note. */
export function CheckList({ items, value, onChange, notes = [] }: { items: CheckItem[]; value: CheckAnswers; onChange: (v: CheckAnswers) => void; notes?: string[] }) {
  return (
    <ol className="flex flex-col gap-2">
      {items.map((it) => {
        const a = value[it.key];
        const set = (patch: Partial<{ answer: CheckAnswer; note: string }>) => onChange({ ...value, [it.key]: { ...a, ...patch } });
        return (
          <li key={it.key} data-check={it.key} className="rounded-control border-2 border-line bg-sunken p-2">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <span id={`check-${it.key}`} className="min-w-0 flex-1 font-bold">{it.label}</span>
              <span role="radiogroup" aria-labelledby={`check-${it.key}`} className="flex gap-2">
                {answers.map((ans) => (
                  <button key={ans} type="button" role="radio" aria-checked={a?.answer === ans} onClick={() => set({ answer: ans })}
                    className={cn('min-h-touch min-w-16 rounded-control border-2 px-3 font-bold',
                      a?.answer === ans ? (ans === 'no' ? 'border-danger bg-danger-soft text-text' : 'border-primary bg-primary text-on-primary') : 'border-line-strong bg-surface')}>
                    {answerLabels[ans]}
                  </button>
                ))}
              </span>
            </div>
            {(notes.includes(it.key) || a?.answer === 'no') && (
              <Input className="mt-2" aria-label={`Note: ${it.label}`} placeholder="Note (optional)" maxLength={500} value={a?.note ?? ''} onChange={(e) => set({ note: e.target.value })} />
            )}
          </li>
        );
      })}
    </ol>
  );
}
