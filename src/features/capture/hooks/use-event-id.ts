import { useEffect, useState } from 'react';
import type { NewEvent } from '#shared/schemas/events.ts';

/**
 * The id of a tapped event once the tablet has kept it (the tap's promise settles after the outbox
 * write), or undefined before then, when it failed, or with no event. Follows only the promise given,
 * so an answer for an earlier tap is never taken for this one.
 */
export function useEventId(event: Promise<NewEvent> | undefined): string | undefined {
  const [settled, setSettled] = useState<{ event: Promise<NewEvent>; id: string } | null>(null);
  useEffect(() => {
    if (!event) return;
    let live = true;
    event.then((e) => { if (live) setSettled({ event, id: e.id }); }, () => undefined);
    return () => { live = false; };
  }, [event]);
  return settled && settled.event === event ? settled.id : undefined;
}
