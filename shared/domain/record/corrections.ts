import type { IdIndex } from './id-index.ts';
import { check, isEventKind, validatePayload, type Intake, type LogEntry } from './intake.ts';
import type { Problem } from './types.ts';


/**
 * Voids. Each void names one target; a void is effective unless it is itself voided, so a void of a void
 * restores its target, and a chain alternates. Voids that name each other in a ring can't be settled
 * either way: they are reported and void nothing. Linear: each void has one target, so the voids form a
 * functional graph whose rings are found by one walk (the colouring of a depth-first search), and the
 * rest is a forest resolved leaves-first with an explicit stack.
 */
function resolveVoids(voids: LogEntry[], byId: IdIndex<LogEntry>, problems: Problem[]): void {
  const targetOf = new Map<string, string>();
  const voidersOf = new Map<string, string[]>();
  for (const e of voids) {
    const target = e.payload!.targetId as string;
    if (target === e.id) { problems.push({ code: 'self_target', eventId: e.id, message: `void ${e.id} names itself` }); continue; }
    if (!byId.has(target)) { problems.push({ code: 'unknown_target', eventId: e.id, message: `void ${e.id} names ${target}, which is not in this case's log` }); continue; }
    targetOf.set(e.id, target);
    const list = voidersOf.get(target);
    if (list) list.push(e.id); else voidersOf.set(target, [e.id]);
  }
  const ringed = new Set<string>();
  const colour = new Map<string, 1 | 2>();
  for (const start of targetOf.keys()) {
    if (colour.has(start)) continue;
    const path: string[] = [];
    let at: string | undefined = start;
    while (at !== undefined && !colour.has(at)) {
      colour.set(at, 1);
      path.push(at);
      at = targetOf.get(at);
    }
    if (at !== undefined && colour.get(at) === 1) for (let i = path.indexOf(at); i < path.length; i++) ringed.add(path[i]!);
    for (const id of path) colour.set(id, 2);
  }
  for (const id of [...ringed].sort()) problems.push({ code: 'void_cycle', eventId: id, message: `void ${id} is part of a ring of voids naming each other; it voids nothing` });

  const isVoided = new Map<string, boolean>();
  for (const root of voidersOf.keys()) {
    const stack = [root];
    while (stack.length > 0) {
      const id = stack[stack.length - 1]!;
      if (isVoided.has(id)) { stack.pop(); continue; }
      const voiders = voidersOf.get(id) ?? [];
      let pending = false;
      for (const v of voiders) if (!ringed.has(v) && !isVoided.has(v)) { stack.push(v); pending = true; }
      if (pending) continue;
      isVoided.set(id, voiders.some((v) => !ringed.has(v) && isVoided.get(v) === false));
      stack.pop();
    }
  }
  // The outcome goes on the entries themselves, so later passes read a field rather than hash an id again.
  for (const [id, voiders] of voidersOf) {
    if (isVoided.get(id)) byId.get(id)!.voidedBy = voiders.filter((v) => !ringed.has(v) && isVoided.get(v) === false);
  }
}

/** The target's payload with the amendment's fields over it; a field set to null is removed. */
function merge(current: unknown, fields: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const put = (k: string, value: unknown) => Object.defineProperty(out, k, { value, enumerable: true, writable: true, configurable: true });
  if (typeof current === 'object' && current !== null && !Array.isArray(current)) {
    for (const k of Object.keys(current)) put(k, (current as Record<string, unknown>)[k]);
  }
  for (const k of Object.keys(fields)) {
    if (fields[k] === null) delete out[k];
    else put(k, fields[k]);
  }
  return out;
}

/**
 * Amendments, applied in log order (corrected time, then sequence, then id), each merged over the result
 * of those before it: for every field, the latest amendment that names it wins. Each merge is validated
 * against the target kind's payload schema; an invalid one is reported and skipped. An amendment can also
 * make a refused event valid (a mistyped size corrected). Voided amendments, and amendments of voided
 * events, have no effect; voids and amendments themselves are not amendable.
 */
function applyAmendments(amends: LogEntry[], byId: IdIndex<LogEntry>, problems: Problem[]): number {
  const amendsOf = new Map<string, LogEntry[]>();
  for (const e of amends) {
    if (e.voidedBy) continue;
    const targetId = e.payload!.targetId as string;
    const target = byId.get(targetId);
    if (targetId === e.id) { problems.push({ code: 'self_target', eventId: e.id, message: `amendment ${e.id} names itself` }); continue; }
    if (!target) { problems.push({ code: 'unknown_target', eventId: e.id, message: `amendment ${e.id} names ${targetId}, which is not in this case's log` }); continue; }
    check(target);
    if (target.kind === 'void' || target.kind === 'amend' || target.status === 'unknown_kind') {
      problems.push({ code: 'not_amendable', eventId: e.id, message: `amendment ${e.id} names a ${target.status === 'unknown_kind' ? 'event of unknown kind' : target.kind}, which cannot be amended (void it instead)` });
      continue;
    }
    if (target.voidedBy) continue;
    const list = amendsOf.get(targetId);
    if (list) list.push(e); else amendsOf.set(targetId, [e]);
  }
  let applied = 0;
  for (const [targetId, amends] of amendsOf) {
    const target = byId.get(targetId)!;
    if (!isEventKind(target.kind)) continue;
    let current: unknown = target.status === 'ok' ? target.payload : target.raw;
    const by: string[] = [];
    for (const a of amends) {
      const v = validatePayload(target.kind, merge(current, a.payload!.fields as Record<string, unknown>));
      if (!v.ok) {
        problems.push({ code: 'invalid_amendment', eventId: a.id, message: `amendment ${a.id} would make ${target.kind} ${targetId} invalid (${v.issue}); not applied` });
        continue;
      }
      current = v.data;
      by.push(a.id);
      applied++;
    }
    if (by.length > 0) {
      target.payload = current as Record<string, unknown>;
      target.amendedBy = by;
      // A refused event that an amendment made valid joins the timeline.
      if (target.status === 'invalid_payload') { target.status = 'ok'; target.issue = null; }
    }
  }
  return applied;
}

/**
 * Applies voids, then amendments, writing the outcome on the entries (`voidedBy`, `amendedBy`, the amended
 * `payload`). Returns the number of amendments applied. The refused events that no void took away and no
 * amendment mended are reported as the timeline is built.
 */
export function applyCorrections(log: Intake, problems: Problem[]): number {
  resolveVoids(log.voids, log.byId, problems);
  return applyAmendments(log.amends, log.byId, problems);
}
