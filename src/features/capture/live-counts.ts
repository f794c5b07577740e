import type { CaseRecord } from '#shared/domain/record/types.ts';

/** The figures on the capture screen's board, taken from the record computed on the tablet. */
export type LiveCounts = {
  clipsDeployed: number;
  clipsMisfired: number;
  loopsPlaced: number;
  bleedsOpen: number;
  bleedsControlled: number;
  /** Start of the most recent open bleed on this tablet's clock (ms), for its running time; null if none. */
  openBleedSinceMs: number | null;
  injectionMl: number;
};

/** The injected volume as the board shows it: to a tenth of a millilitre. */
export const boardMl = (ml: number) => Math.round(ml * 10) / 10;

/**
 * `offsetMs` is server minus tablet clock: the record's times are corrected (server clock), the ticking
 * timer reads the tablet's clock, so an open bleed's start is moved back onto the tablet's clock.
 */
export function toLiveCounts(record: CaseRecord, offsetMs: number): LiveCounts {
  const open = latestOpenBleed(record);
  const c = record.counts;
  return {
    clipsDeployed: c.clipsDeployed,
    clipsMisfired: c.clipsMisfired,
    loopsPlaced: c.loopsPlaced,
    bleedsOpen: c.bleedsOpen,
    bleedsControlled: record.bleeds.filter((b) => b.controlledMs !== null).length,
    openBleedSinceMs: open ? open.startMs - offsetMs : null,
    injectionMl: boardMl(c.injectionMl),
  };
}

/** The open bleed a haemostasis tap belongs to: the most recent one not yet controlled. */
export function latestOpenBleed(record: CaseRecord) {
  let open: CaseRecord['bleeds'][number] | null = null;
  for (const b of record.bleeds) if (b.controlledMs === null && (!open || b.startMs >= open.startMs)) open = b;
  return open;
}

export const sameCounts = (a: LiveCounts, b: LiveCounts) =>
  (Object.keys(a) as (keyof LiveCounts)[]).every((k) => a[k] === b[k]);
