import type { TimelineEvent } from '#shared/domain/record/index.ts';
import { sedationTypeLabels } from '#shared/schemas/cases.ts';
import { eventLabels, type EventKind } from '#shared/schemas/events.ts';
import { retrievalMethodLabels } from '#shared/schemas/specimens.ts';
import { haemostasisMethodWords } from '#shared/schemas/record.ts';

const sydney = ['0', 'I', 'II', 'III', 'IV', 'V'];

/** The row label: a clip says how it went, a haemostasis whether it held. */
export function labelOf(kind: string, payload: Record<string, unknown>): string {
  if (kind === 'clip_fired') return payload.outcome === 'misfired' ? 'Clip misfired' : 'Clip deployed';
  if (kind === 'haemostasis') return payload.achieved ? 'Haemostasis achieved' : 'Haemostasis attempted';
  return eventLabels[kind as EventKind] ?? kind;
}

const num = (x: number) => (Number.isInteger(x) ? String(x) : x.toFixed(1));

/** An event's details in plain words, for the timeline of the page and the PDF alike. */
export function detailOf(e: TimelineEvent, itemName: (id: string) => string): string {
  const parts: (string | null | false | undefined)[] = [];
  const item = (id: string | undefined) => id && `item: ${itemName(id)}`;
  switch (e.kind) {
    case 'sedation_start': parts.push(e.payload.type && sedationTypeLabels[e.payload.type]); break;
    case 'time_out':
    case 'sign_out': {
      if (e.payload.skipped) parts.push(`skipped: ${e.payload.skipped.reason}`);
      const items = e.payload.items ?? [];
      const no = items.filter((i) => i.answer === 'no').map((i) => i.label ?? i.key);
      if (items.length) parts.push(`${items.length} item${items.length === 1 ? '' : 's'} answered`, no.length > 0 && `answered no: ${no.join(', ')}`);
      break;
    }
    case 'injection': {
      const p = e.payload;
      parts.push(p.volumeMl !== undefined && `${num(p.volumeMl)} ml`, p.agent, p.dye && `dye: ${p.dye}`);
      break;
    }
    case 'resection_complete':
      parts.push(e.payload.enBloc === true ? 'en bloc' : e.payload.enBloc === false ? 'piecemeal' : null, e.payload.pieces !== undefined && `${e.payload.pieces} piece${e.payload.pieces === 1 ? '' : 's'}`);
      break;
    case 'muscle_defect':
      parts.push(e.payload.dmiType !== undefined && `Sydney type ${sydney[e.payload.dmiType]}`, e.payload.sizeMm !== undefined && `${num(e.payload.sizeMm)} mm`, e.payload.perforation === true && 'perforation');
      break;
    case 'decompression': parts.push(e.payload.site); break;
    case 'bleed': parts.push(e.payload.severity === 'spurting' ? 'spurting' : e.payload.severity === 'ooze' ? 'oozing' : null, e.payload.vesselMm !== undefined && `vessel ${num(e.payload.vesselMm)} mm`); break;
    case 'haemostasis': parts.push(e.payload.method && haemostasisMethodWords[e.payload.method]); break;
    case 'coagulation': parts.push(e.payload.target); break;
    case 'clip_fired': parts.push(e.payload.purpose && `for ${e.payload.purpose}`, item(e.payload.itemId)); break;
    case 'loop_placed': parts.push(e.payload.sizeMm !== undefined && `${num(e.payload.sizeMm)} mm`, item(e.payload.itemId)); break;
    case 'device_applied': parts.push(item(e.payload.itemId)); break;
    case 'device_opened':
    case 'device_wasted': parts.push(e.payload.quantity !== undefined && `× ${e.payload.quantity}`, item(e.payload.itemId), e.payload.reason); break;
    case 'closure_complete': parts.push(e.payload.complete && `${e.payload.complete} closure`, e.payload.method); break;
    case 'specimen_retrieved': {
      const p = e.payload;
      parts.push(p.method && retrievalMethodLabels[p.method].toLowerCase(), p.pieces !== undefined && `${p.pieces} piece${p.pieces === 1 ? '' : 's'}`,
        p.longMm !== undefined && p.shortMm !== undefined && `${num(p.longMm)} × ${num(p.shortMm)} mm`);
      break;
    }
    case 'specimen_labelled': parts.push(e.payload.containerId && `container ${e.payload.containerId}`); break;
    case 'image': parts.push(e.payload.caption); break;
    case 'medication': {
      const p = e.payload;
      parts.push(p.drug, p.dose !== undefined && `${num(p.dose)}${p.unit ? ` ${p.unit}` : ''}`, p.route);
      break;
    }
    case 'esu_setting': parts.push(e.payload.modeLabel, e.payload.effect !== undefined && `effect ${num(e.payload.effect)}`, e.payload.watts !== undefined && `${num(e.payload.watts)} W`); break;
    case 'remark': parts.push(e.payload.text); break;
    default: break;
  }
  return parts.filter((p): p is string => typeof p === 'string' && p.length > 0).join(', ');
}

