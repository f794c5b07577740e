// The bench's own calls to the server's API, through a signed-in browser context's request client.
import { v7 as uuidv7 } from 'uuid';

async function json(request, path) {
  const res = await request.get(path);
  if (!res.ok()) throw new Error(`GET ${path} answered ${res.status()}: ${await res.text()}`);
  return res.json();
}

/** Schedule a case for now in the signed-in user's unit; returns its id. The patient is invented. */
export async function scheduleCase(context, origin) {
  const rooms = await json(context.request, '/api/rooms');
  const members = await json(context.request, '/api/members');
  const nurse = members.find((m) => m.role === 'nurse');
  const endoscopist = members.find((m) => m.role === 'endoscopist');
  const tag = Math.random().toString(36).slice(2, 8).toUpperCase();
  const res = await context.request.post('/api/cases', {
    headers: { origin },
    data: {
      patient: { hospitalNumber: `BENCH-${tag}`, familyName: `Benchcase${tag}`, givenName: 'Sam', birthDate: '1960-01-01', sex: 'unknown' },
      procedureType: 'esd', indication: 'Invented case for the bench', lesion: { site: 'gastric antrum', sizeMm: 30, paris: '0-IIa' },
      roomId: rooms[0].id, scheduledAt: new Date().toISOString(), sedation: 'deep', endoscopistId: endoscopist.userId, nurseId: nurse.userId,
    },
  });
  if (res.status() !== 201) throw new Error(`POST /api/cases answered ${res.status()}: ${await res.text()}`);
  return (await res.json()).id;
}

export const me = (context) => json(context.request, '/api/me');

/**
 * `n` events of a plausible case (milestones, injections, bleeds and haemostasis, clips, loops, remarks),
 * as a tablet of id `device` would have made them over the past hour.
 */
export function caseEvents({ caseId, author, device, n, endMs = Date.now() }) {
  const kinds = [
    ['injection', { volumeMl: 2 }], ['dissection', {}], ['clip_fired', { outcome: 'deployed' }], ['bleed', { severity: 'ooze' }],
    ['coagulation', {}], ['haemostasis', { achieved: true }], ['loop_placed', { sizeMm: 20 }], ['image', { caption: 'view' }],
    ['remark', { text: 'note' }], ['clip_fired', { outcome: 'misfired' }], ['esu_setting', { modeLabel: 'cut', effect: 3, watts: 40 }],
  ];
  const start = endMs - 60 * 60_000;
  const out = [['patient_in', {}], ['scope_in', {}]].map(([kind, payload], i) => ({ kind, payload, at: start + i * 1000 }));
  for (let i = out.length; i < n; i++) {
    const [kind, payload] = kinds[i % kinds.length];
    out.push({ kind, payload, at: start + Math.round((i / n) * 60 * 60_000) });
  }
  return out.map(({ kind, payload, at }) => ({
    id: uuidv7({ msecs: at }), caseId, kind, payload, deviceTime: new Date(at).toISOString(),
    offsetMs: 0, offsetUncertaintyMs: 2, author, device,
  }));
}

/** Store events through POST /api/cases/:id/events, in batches the server takes. */
export async function pushEvents(context, origin, caseId, events) {
  for (let i = 0; i < events.length; i += 200) {
    const res = await context.request.post(`/api/cases/${caseId}/events`, { headers: { origin }, data: { events: events.slice(i, i + 200) } });
    if (!res.ok()) throw new Error(`POST events answered ${res.status()}: ${await res.text()}`);
    const { results } = await res.json();
    const refused = results.filter((r) => r.status === 'refused');
    if (refused.length) throw new Error(`The server refused seeded events: ${refused[0].reason}`);
  }
}
