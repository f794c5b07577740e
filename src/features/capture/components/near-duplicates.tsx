import { useState } from 'react';
import type { NearDuplicatePair } from '#shared/domain/near-duplicates.ts';
import { Button } from '@/components/ui/button.tsx';
import { Input } from '@/components/ui/field.tsx';
import { formatClock } from '../hooks/use-now.ts';
import { labelOf } from '../rows.ts';
import { correctedTimeMs } from '#shared/schemas/events.ts';

type Props = {
  pairs: readonly NearDuplicatePair[];
  myDevice: string | null;
  authorName: (userId: string) => string;
  onKeepBoth: (key: string) => void;
  onVoid: (eventId: string, reason: string) => void;
};

const DEFAULT_REASON = 'Same event recorded on two tablets';

/**
 * Two tablets recorded the same kind of event within seconds: one clip tapped twice, or two clips?
 * Only a person in the room knows, so the screen asks and never merges on its own.
 */
export function NearDuplicates({ pairs, myDevice, authorName, onKeepBoth, onVoid }: Props) {
  const pair = pairs[0];
  const [reason, setReason] = useState(DEFAULT_REASON);
  if (!pair) return null;
  const who = (device: string, author: string) => (device === myDevice ? 'this tablet' : `${authorName(author)}'s tablet`);
  const label = labelOf(pair.first.kind, pair.first.payload as Record<string, unknown>);
  return (
    <section role="alert" data-testid="near-duplicate" data-pair={pair.key}
      className="flex flex-col gap-2 rounded-card border-4 border-double border-caution-line bg-caution-soft p-3">
      <p className="font-bold">
        <span aria-hidden>⧉ </span>“{label}” was recorded on two tablets {(pair.gapMs / 1000).toFixed(1)} s apart. One event or two?
        {pairs.length > 1 && <span className="font-normal"> ({pairs.length - 1} more to check)</span>}
      </p>
      <ul className="text-sm">
        {[pair.first, pair.second].map((e) => <li key={e.id}>{formatClock(correctedTimeMs(e))} on {who(e.device, e.author)}</li>)}
      </ul>
      <Input aria-label="Reason for voiding one" maxLength={500} value={reason} onChange={(e) => setReason(e.target.value)} />
      <div className="flex flex-wrap gap-2">
        <Button size="lg" onClick={() => onKeepBoth(pair.key)}>Two events: keep both</Button>
        {[pair.first, pair.second].map((e) => (
          <Button key={e.id} size="lg" variant="danger" disabled={!reason.trim()} onClick={() => { onVoid(e.id, reason.trim()); setReason(DEFAULT_REASON); }}>
            Same: void the one from {who(e.device, e.author)}
          </Button>
        ))}
      </div>
    </section>
  );
}
