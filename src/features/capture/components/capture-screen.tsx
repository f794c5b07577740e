import { memo, useCallback, useMemo, useRef, useState } from 'react';
import type { EventKind, NewEvent, PayloadOf } from '#shared/schemas/events.ts';
import type { CaseSummary } from '#shared/schemas/cases.ts';
import type { CheckRecord } from '#shared/domain/record/types.ts';
import { Caution } from '@/components/ui/caution.tsx';
import { useToast } from '@/components/ui/toast.tsx';
import { useRecordTap, useSyncEngine, useSyncStatus } from '@/sync/react.ts';
import { useCaptureMembers } from '../api/get-members.ts';
import { useCaptureModel, useStable } from '../hooks/use-capture-model.ts';
import { useCaseSnapshot } from '../hooks/use-case-snapshot.ts';
import { useEventId } from '../hooks/use-event-id.ts';
import { useKeptPairs } from '../hooks/use-kept-pairs.ts';
import { useWakeLock } from '../hooks/use-wake-lock.ts';
import { afterPaint } from '../hooks/after-paint.ts';
import { haptic, vibrate } from '../hooks/haptics.ts';
import { tapPayload, type TapButton } from '../vocabulary.ts';
import { CaptureHeader, useClockOffset } from './capture-header.tsx';
import { CounterBoard } from './counter-board.tsx';
import type { ItemControl } from './detail-fields.tsx';
import { DetailPanel, type PanelTarget } from './detail-panel.tsx';
import { NearDuplicates } from './near-duplicates.tsx';
import { QuickStrip } from './quick-strip.tsx';
import { RecentList } from './recent-list.tsx';
import { RefusedPanel } from './refused-panel.tsx';
import { SignOutSheet } from './sign-out-sheet.tsx';
import { TapPad } from './tap-pad.tsx';
import { TimeOutSheet } from './time-out-sheet.tsx';
import { UndoBar } from './undo-bar.tsx';

type Props = {
  caseId: string;
  /** The case's header facts; null while loading or when offline with nothing kept. */
  summary: CaseSummary | null;
  /** The catalogue-item control of the devices feature (a scan field), if the route hands one in. */
  ItemInput?: ItemControl;
  itemLabel?: (itemId: string) => string;
};

type LastTap = { key: string; label: string; at: number; event: Promise<NewEvent> };
type Panel =
  | { mode: 'after-tap'; target: PanelTarget; event: Promise<NewEvent>; full: boolean }
  | { mode: 'edit'; id: string }
  | { mode: 'create'; target: PanelTarget };

let tapSeq = 0;

/** The refused list, subscribed to the sync status itself (only while it is open). */
function RefusedSheet({ onClose, ItemInput }: { onClose: () => void; ItemInput?: ItemControl }) {
  const engine = useSyncEngine();
  const status = useSyncStatus();
  return (
    <RefusedPanel open onClose={onClose} refused={status.refused} ItemInput={ItemInput}
      onResubmit={(id, changes) => engine.resubmitRefused(id, changes)} onDiscard={(id, why) => engine.discardRefused(id, why)} />
  );
}

const sameCheck = (a: CheckRecord, b: CheckRecord) =>
  a.status === b.status && a.eventId === b.eventId && a.atMs === b.atMs && a.reason === b.reason && a.answeredNo.join() === b.answeredNo.join();

const idLabel = (id: string) => id;

/** The recorder: one tap per event, counted and shown at once, kept on the tablet first. */
export function CaptureScreen({ caseId, summary, ItemInput, itemLabel = idLabel }: Props) {
  useWakeLock();
  const members = useCaptureMembers().data;
  const names = useMemo(() => {
    const m = new Map<string, string>((members ?? []).map((p) => [p.userId, p.name]));
    if (summary) for (const p of [summary.nurse, summary.endoscopist]) if (!m.has(p.id)) m.set(p.id, p.name);
    return m;
  }, [members, summary]);
  const authorName = useCallback((id: string) => names.get(id) ?? 'another user', [names]);
  return <CaptureBody caseId={caseId} summary={summary} ItemInput={ItemInput} itemLabel={itemLabel} authorName={authorName} />;
}

/**
 * The part that follows the case's events. Memoised apart from the queries above it, so that a tap
 * re-renders only what a tap changes.
 */
const CaptureBody = memo(function CaptureBody({ caseId, summary, ItemInput, itemLabel, authorName }: Required<Pick<Props, 'itemLabel'>> & Omit<Props, 'itemLabel'> & { authorName: (id: string) => string }) {
  const engine = useSyncEngine();
  const snapshot = useCaseSnapshot(caseId);
  const offsetMs = useClockOffset();
  const recordTap = useRecordTap();
  const notify = useToast();
  const device = engine.deviceId || null;
  const model = useCaptureModel(snapshot, { offsetMs, device, authorName });
  const closed = snapshot.status === 'closed' || model.record.signOut.status === 'present';
  const timeOut = useStable(model.record.timeOut, sameCheck);
  const signOut = useStable(model.record.signOut, sameCheck);

  const [lastTap, setLastTap] = useState<LastTap | null>(null);
  const [panel, setPanel] = useState<Panel | null>(null);
  const [sheet, setSheet] = useState<'time-out' | 'sign-out' | 'refused' | null>(null);
  const [kept, keep] = useKeptPairs(caseId);

  // The tap handler reads the tally through a ref so that it keeps one identity (the pad never re-renders).
  const { tally } = model;

  const record = useCallback(<K extends EventKind>(kind: K, payload: PayloadOf<K>): Promise<NewEvent> => {
    const p = recordTap({ caseId, kind, payload }) as Promise<NewEvent>;
    p.catch((err: unknown) => {
      vibrate(haptic.refused);
      notify(`Not saved on this tablet: ${err instanceof Error ? err.message : String(err)}`, 'danger');
    });
    return p;
  }, [caseId, recordTap, notify]);

  const onTap = useCallback((btn: TapButton) => {
    if (btn.sheetFirst) {
      setPanel({ mode: 'create', target: { key: `new-${++tapSeq}`, kind: btn.kind, label: btn.label, timeMs: Date.now() + offsetMs, payload: tapPayload(btn), voided: false } });
      return;
    }
    vibrate(haptic.tap);
    const payload = tapPayload(btn);
    if (btn.kind === 'haemostasis') {
      const open = tally.current?.openBleed;
      if (open) payload.bleedId = open.bleedId;
    }
    const event = record(btn.kind, payload as PayloadOf<typeof btn.kind>);
    const key = `tap-${++tapSeq}`;
    const at = Date.now();
    // The undo and the quick sheet are drawn in the frame after the tap's own: they must never hold
    // back the count and the row.
    afterPaint(() => {
      setLastTap({ key, label: btn.label, at, event });
      setPanel(btn.details.length
        ? { mode: 'after-tap', event, full: false, target: { key, kind: btn.kind, label: btn.label, timeMs: at + offsetMs, payload, voided: false } }
        : null);
    });
  }, [record, offsetMs, tally]);

  const amend = useCallback((id: string, fields: Record<string, unknown>) => void record('amend', { targetId: id, fields }).catch(() => undefined), [record]);
  const voidEvent = useCallback((id: string, reason: string) => void record('void', { targetId: id, reason }).catch(() => undefined), [record]);

  const undo = useCallback(() => {
    const t = lastTap;
    if (!t) return;
    setLastTap(null);
    setPanel((p) => (p?.mode === 'after-tap' && p.target.key === t.key ? null : p));
    vibrate(haptic.undo);
    void t.event.then((e) => voidEvent(e.id, 'undo'), () => undefined);
  }, [lastTap, voidEvent]);
  const expireUndo = useCallback(() => setLastTap(null), []);
  const openRefused = useCallback(() => setSheet('refused'), []);
  const openTimeOut = useCallback(() => setSheet('time-out'), []);
  const openSignOut = useCallback(() => setSheet('sign-out'), []);
  const closeSheet = useCallback(() => setSheet(null), []);
  const openRow = useCallback((id: string) => setPanel({ mode: 'edit', id }), []);
  const closePanel = useCallback(() => setPanel(null), []);

  const editRow = panel?.mode === 'edit' ? model.rows.find((r) => r.id === panel.id) : undefined;
  // A full sheet (all fields) takes the list's place until it is closed; the one-line strip does not.
  const fullPanel = Boolean(editRow) || panel?.mode === 'create' || (panel?.mode === 'after-tap' && panel.full);
  const afterTapAmend = useCallback((p: Extract<Panel, { mode: 'after-tap' }>, fields: Record<string, unknown>) => {
    // The sheet remembers the answer, so "More…" opens with it chosen.
    setPanel((cur) => (cur === p ? { ...p, target: { ...p.target, payload: { ...p.target.payload, ...fields } } } : cur));
    void p.event.then((e) => amend(e.id, fields), () => undefined);
  }, [amend]);
  // Stable handlers for the quick strip, so that it is not redrawn by every sync-state change.
  const panelRef = useRef(panel);
  panelRef.current = panel;
  const pickAfterTap = useCallback((fields: Record<string, unknown>) => {
    const p = panelRef.current;
    if (p?.mode === 'after-tap') afterTapAmend(p, fields);
  }, [afterTapAmend]);
  const moreAfterTap = useCallback(() => setPanel((p) => (p?.mode === 'after-tap' ? { ...p, full: true } : p)), []);
  // The tapped event's id, for the full sheet's scan field to link a label to it (the strip has no scan field).
  const afterTapId = useEventId(panel?.mode === 'after-tap' && panel.full ? panel.event : undefined);
  // The sign-out sheet reconciles the record as it is now, not as of the last paint.
  const { recordNow } = model;
  const signOutRecord = useMemo(() => (sheet === 'sign-out' ? recordNow() : null), [sheet, recordNow]);
  const pairs = useMemo(() => snapshot.nearDuplicates.filter((p) => !kept.has(p.key)), [snapshot.nearDuplicates, kept]);

  return (
    <div className="flex h-dvh flex-col bg-canvas text-text" data-testid="capture-screen" data-case-id={caseId}>
      <CaptureHeader caseId={caseId} summary={summary} clock={model.clock} timeOut={timeOut} signOut={signOut} closed={closed}
        onTimeOut={openTimeOut} onSignOut={openSignOut} onOpenRefused={openRefused} />

      <main className="flex min-h-0 flex-1 gap-3 p-3 portrait:flex-col landscape:flex-row">
        <div className="min-h-0 min-w-0 overflow-y-auto portrait:order-2 portrait:shrink-0 landscape:flex-1">
          {snapshot.error && <p role="alert" className="mb-2 rounded-control border-2 border-danger bg-danger-soft p-2 font-bold">{snapshot.error}</p>}
          {closed && <p role="status" className="mb-2 rounded-control border-2 border-line-strong bg-sunken p-2 font-bold">The record is closed (signed out). Corrections are recorded as amendments.</p>}
          <TapPad onTap={onTap} disabled={closed} />
        </div>
        <aside className="flex min-h-0 flex-col gap-3 portrait:contents landscape:w-[26rem]" aria-label="Counts and recent events">
          <div className="flex flex-col gap-3 portrait:order-1">
            <CounterBoard counts={model.counts} />
            <NearDuplicates pairs={pairs} myDevice={device} authorName={authorName} onKeepBoth={keep} onVoid={voidEvent} />
          </div>
          <div className="flex min-h-0 flex-1 flex-col gap-2 portrait:order-3">
            {lastTap && <UndoBar key={`undo-${lastTap.key}`} label={lastTap.label} tappedAt={lastTap.at} onUndo={undo} onExpire={expireUndo} />}
            {panel?.mode === 'after-tap' && !panel.full && (
              <QuickStrip key={`strip-${panel.target.key}`} target={panel.target} onClose={closePanel} onMore={moreAfterTap} onPick={pickAfterTap} />
            )}
            {panel?.mode === 'after-tap' && panel.full && (
              <DetailPanel key={`sheet-${panel.target.key}`} mode="after-tap" target={panel.target} ItemInput={ItemInput} eventId={afterTapId} onClose={closePanel} className="flex-1"
                onAmend={(fields) => afterTapAmend(panel, fields)} onCreate={() => undefined} onVoid={() => undefined} />
            )}
            {panel?.mode === 'create' && (
              <DetailPanel key={`sheet-${panel.target.key}`} mode="create" target={panel.target} ItemInput={ItemInput} onClose={closePanel} className="flex-1"
                onCreate={(payload) => void record(panel.target.kind, payload as never).catch(() => undefined)} onAmend={() => undefined} onVoid={() => undefined} />
            )}
            {editRow && (
              <DetailPanel key={`edit-${editRow.id}`} mode="edit" ItemInput={ItemInput} eventId={editRow.id} onClose={closePanel} className="flex-1"
                target={{ key: editRow.id, kind: editRow.kind, label: editRow.label, timeMs: editRow.timeMs, payload: editRow.payload, voided: editRow.voided }}
                onAmend={(fields) => amend(editRow.id, fields)} onVoid={(reason) => voidEvent(editRow.id, reason)} onCreate={() => undefined} />
            )}
            {!fullPanel && (
              <div className="min-h-0 flex-1 overflow-y-auto overscroll-contain contain-strict">
                <RecentList rows={model.rows} originMs={model.clock.originMs} onOpen={openRow} />
              </div>
            )}
          </div>
        </aside>
      </main>

      <footer className="px-3 pb-2">
        <Caution compact />
      </footer>

      {/* Mounted only while open: the sheets cost nothing on the path of a tap. */}
      {sheet === 'time-out' && <TimeOutSheet open onClose={closeSheet} onRecord={(p) => void record('time_out', p).catch(() => undefined)} />}
      {sheet === 'sign-out' && signOutRecord && (
        <SignOutSheet open onClose={closeSheet} record={signOutRecord} itemLabel={itemLabel} onRecord={(p) => void record('sign_out', p).catch(() => undefined)} />
      )}
      {sheet === 'refused' && <RefusedSheet onClose={closeSheet} ItemInput={ItemInput} />}
    </div>
  );
});
