import type { DeviceTally, TimelineEvent } from './types.ts';

/** The key for device events that named no catalogue item. */
export const UNSPECIFIED_ITEM = 'unspecified';

/**
 * Device counts per catalogue item (PRODUCT.md, sign-out: opened = used + wasted), one event at a time.
 * Opened and wasted add their quantity (1 when absent); a deployed clip, a loop placed and a device applied
 * are deployed and left in the patient; a misfired clip is counted apart. The unaccounted remainder is
 * flagged when something was opened and it is not zero.
 */
export class DeviceTallies {
  private readonly tallies = new Map<string, DeviceTally>();

  private tally(itemId: string | undefined): DeviceTally {
    const key = itemId ?? UNSPECIFIED_ITEM;
    let t = this.tallies.get(key);
    if (!t) { t = { itemId: key, opened: 0, deployed: 0, misfired: 0, wasted: 0, inPatient: 0, unaccounted: 0, flagged: false }; this.tallies.set(key, t); }
    return t;
  }

  add(e: TimelineEvent): void {
    switch (e.kind) {
      case 'device_opened': this.tally(e.payload.itemId).opened += e.payload.quantity ?? 1; break;
      case 'device_wasted': this.tally(e.payload.itemId).wasted += e.payload.quantity ?? 1; break;
      case 'clip_fired': {
        const t = this.tally(e.payload.itemId);
        if (e.payload.outcome === 'deployed') { t.deployed++; t.inPatient++; } else t.misfired++;
        break;
      }
      case 'loop_placed':
      case 'device_applied': { const t = this.tally(e.payload.itemId); t.deployed++; t.inPatient++; break; }
      default: break;
    }
  }

  /** The tallies, catalogue items in id order and the unnamed ones last. */
  finish(): DeviceTally[] {
    const out = [...this.tallies.values()];
    for (const t of out) {
      t.unaccounted = t.opened - t.deployed - t.misfired - t.wasted;
      t.flagged = t.opened > 0 && t.unaccounted !== 0;
    }
    return out.sort((a, b) => (a.itemId === UNSPECIFIED_ITEM ? 1 : b.itemId === UNSPECIFIED_ITEM ? -1 : a.itemId < b.itemId ? -1 : a.itemId > b.itemId ? 1 : 0));
  }
}
