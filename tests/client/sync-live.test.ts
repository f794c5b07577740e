import { afterEach, describe, expect, it } from 'vitest';
import { caseRoom, SyncMessages } from '#shared/contracts/sync.ts';
import { buildEvent } from '../factories/events.ts';
import { eventually, newCaseId, newDbName, startTablet, stopTablets } from './sync-helpers.ts';
import { startTestSyncServer, type TestSyncServer } from './sync-test-server.ts';

let server: TestSyncServer;
afterEach(async () => {
  await stopTablets();
  await server?.close();
});

/**
 * As the server does: a socket keeps the session of its handshake, and a push over a socket whose
 * session has ended is answered 'unauthorized' (here before the test server's own handler, whose later
 * answer is then ignored). A new handshake carries the session signed in now. Returns "end the
 * sessions of the sockets connected now".
 */
function endingSessions(server: TestSyncServer): () => void {
  const ended = new Set<string>();
  server.io.on('connection', (s) => s.prependListener(SyncMessages.eventsPush, (_msg: unknown, ack: (a: unknown) => void) => {
    if (ended.has(s.id)) ack({ error: 'Your session has ended; sign in again', code: 'unauthorized' });
  }));
  return () => { for (const s of server.io.sockets.sockets.values()) ended.add(s.id); };
}

/** A new case and a tablet connected to `server`, recording as `author`. */
async function connectedTablet(server: TestSyncServer, author?: string) {
  const caseId = newCaseId();
  const tablet = startTablet(server.url, { dbName: newDbName(), ...(author ? { author } : {}) });
  await eventually(() => expect(tablet.status.getSnapshot().connected).toBe(true));
  return { caseId, tablet };
}

/** Until the tap is accepted on the tablet (and the server holds it). */
const acceptedOn = (tablet: ReturnType<typeof startTablet>, caseId: string, tapId: string) =>
  eventually(() => expect(tablet.caseView(caseId).getSnapshot().items.map((i) => [i.id, i.state])).toEqual([[tapId, 'accepted']]));

describe('live sync between tablets', () => {
  it('shows a tap from another tablet in the same case as it is stored', async () => {
    server = await startTestSyncServer();
    const caseId = newCaseId();
    const a = startTablet(server.url, { dbName: newDbName() });
    const b = startTablet(server.url, { dbName: newDbName() });
    await Promise.all([a.openCase(caseId), b.openCase(caseId)]);
    const tap = await a.recordTap({ caseId, kind: 'bleed', payload: { severity: 'spurting' } });
    await eventually(() => expect(b.caseView(caseId).getSnapshot().items.map((i) => [i.id, i.state, i.seq])).toEqual([[tap.id, 'accepted', 1]]));
  });

  it('shows near-duplicate taps from two tablets as a pair, keeping both', async () => {
    server = await startTestSyncServer();
    const caseId = newCaseId();
    const a = startTablet(server.url, { dbName: newDbName() });
    const b = startTablet(server.url, { dbName: newDbName() });
    await Promise.all([a.openCase(caseId), b.openCase(caseId)]);
    await a.recordTap({ caseId, kind: 'clip_fired', payload: { outcome: 'deployed' } });
    await b.recordTap({ caseId, kind: 'clip_fired', payload: { outcome: 'deployed' } });
    await eventually(() => expect(a.caseView(caseId).getSnapshot().items.filter((i) => i.state === 'accepted')).toHaveLength(2));
    const snap = a.caseView(caseId).getSnapshot();
    expect(snap.nearDuplicates).toHaveLength(1);
    expect(snap.items).toHaveLength(2);
  });

  it('asks after a reconnect for what it missed since its last sequence, and gets only that', async () => {
    server = await startTestSyncServer();
    const caseId = newCaseId();
    const tablet = startTablet(server.url, { dbName: newDbName() });
    await tablet.openCase(caseId);
    await tablet.recordTap({ caseId, kind: 'patient_in', payload: {} });
    await eventually(() => expect(tablet.caseView(caseId).getSnapshot().lastSeq).toBe(1));

    const joins: number[] = [];
    server.io.on('connection', (s) => s.on(SyncMessages.caseJoin, (m) => { joins.push(m.afterSeq); }));
    for (const s of server.io.sockets.sockets.values()) s.conn.close(); // the network drops; Socket.IO reconnects by itself
    server.storeFromElsewhere(caseId, [buildEvent('scope_in', { caseId, device: 'tablet-other' }), buildEvent('marking', { caseId, device: 'tablet-other' })]);

    await eventually(() => expect(tablet.caseView(caseId).getSnapshot().items.map((i) => [i.event.kind, i.seq])).toEqual([['patient_in', 1], ['scope_in', 2], ['marking', 3]]));
    expect(joins).toEqual([1]);
  });

  it('stamps taps with the server clock offset measured at connect, and its uncertainty', async () => {
    server = await startTestSyncServer({ clockShiftMs: 30_000 }); // the server runs 30 s ahead
    const caseId = newCaseId();
    const tablet = startTablet(server.url, { dbName: newDbName() });
    await eventually(() => expect(tablet.status.getSnapshot().clock).not.toBeNull());
    const tap = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    // On loopback the round trip is a few ms, so θ is within δ/2 of the 30 000 ms shift (RFC 5905 §8).
    expect(Math.abs(tap.offsetMs - 30_000)).toBeLessThanOrEqual((tap.offsetUncertaintyMs ?? 0) + 1);
    expect(tap.offsetUncertaintyMs).toBeLessThan(100);
  });

  it('stays in the case\'s room when the screen leaves the case and comes back while the join is on its way', async () => {
    server = await startTestSyncServer();
    const caseId = newCaseId();
    const tablet = startTablet(server.url, { dbName: newDbName() });
    await eventually(() => expect(tablet.status.getSnapshot().connected).toBe(true));
    // When the server takes the first join (its answer not yet back), the screen closes the case and
    // opens it again: the server then sees join, leave, and the tablet must join once more.
    let reopened = false;
    for (const s of server.io.sockets.sockets.values()) {
      s.on(SyncMessages.caseJoin, () => {
        if (reopened) return;
        reopened = true;
        tablet.closeCase(caseId);
        void tablet.openCase(caseId);
      });
    }
    await tablet.openCase(caseId);
    await eventually(() => expect(reopened).toBe(true));
    await eventually(async () => expect((await server.io.in(caseRoom(caseId)).fetchSockets()).length).toBe(1));

    const other = buildEvent('bleed', { caseId, device: 'tablet-other', payload: { severity: 'ooze' } });
    server.storeFromElsewhere(caseId, [other]);
    await eventually(() => expect(tablet.caseView(caseId).getSnapshot().items.map((i) => i.id)).toContain(other.id));
  });

  it('sends the taps of a user who signs in after another signed out on the same page', async () => {
    server = await startTestSyncServer();
    const endSessions = endingSessions(server);
    const { caseId, tablet } = await connectedTablet(server);

    endSessions(); // the first nurse signed out
    tablet.setAuthor('user-test-nurse-two'); // the second signed in
    const tap = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    await acceptedOn(tablet, caseId, tap.id);
    expect(tap.author).toBe('user-test-nurse-two');
  });

  it('closes its socket at a sign-out and sends what was tapped meanwhile once the same user signs in again', async () => {
    server = await startTestSyncServer();
    const endSessions = endingSessions(server);
    const author = 'user-test-nurse-one';
    const { caseId, tablet } = await connectedTablet(server, author);

    endSessions();
    tablet.signedOut();
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ connected: false, state: 'offline' }));
    await eventually(() => expect(server.io.sockets.sockets.size).toBe(0)); // it hears no case's room while signed out
    const tap = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    expect(tablet.status.getSnapshot().waiting).toBe(1);

    tablet.setAuthor(author); // the same nurse signs in again: a new handshake, with the new session
    await acceptedOn(tablet, caseId, tap.id);
  });

  it('says so when the server closes its socket for an ended session, and connects again at the next sign-in of the same user', async () => {
    server = await startTestSyncServer();
    const author = 'user-test-nurse-one';
    const { caseId, tablet } = await connectedTablet(server, author);

    // The session was ended on another page; the server's rights check closes the socket.
    server.io.disconnectSockets(true);
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ connected: false, state: 'offline', sessionEnded: true, lastError: expect.stringMatching(/sign in again/) }));
    const tap = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    expect(tablet.status.getSnapshot().waiting).toBe(1);

    tablet.setAuthor(author); // the same nurse signs in again
    await acceptedOn(tablet, caseId, tap.id);
    expect(tablet.status.getSnapshot()).toMatchObject({ lastError: null, sessionEnded: false });
  });

  it('takes a push answered "unauthorized" as an ended session, and connects again at the next sign-in of the same user', async () => {
    server = await startTestSyncServer();
    const endSessions = endingSessions(server);
    const author = 'user-test-nurse-one';
    const { caseId, tablet } = await connectedTablet(server, author);

    endSessions(); // expired, say, with the socket still open
    const tap = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ sessionEnded: true, waiting: 1 }));
    tablet.setAuthor(author); // the same nurse signs in again: a new handshake, with the new session
    await acceptedOn(tablet, caseId, tap.id);
    expect(tablet.status.getSnapshot().sessionEnded).toBe(false);
  });

  it('takes a refused handshake as an ended session, and connects at the next sign-in of the same user', async () => {
    server = await startTestSyncServer();
    let refusing = true;
    // As the server's handshake check does (server/realtime/session.ts) when the cookie's session is gone.
    server.io.use((_socket, next) => next(refusing ? Object.assign(new Error('Sign in first'), { data: { code: 'unauthorized' } }) : undefined));
    const caseId = newCaseId();
    const author = 'user-test-nurse-one';
    const tablet = startTablet(server.url, { dbName: newDbName(), author });
    await eventually(() => expect(tablet.status.getSnapshot()).toMatchObject({ connected: false, sessionEnded: true, lastError: 'Sign in first' }));
    const tap = await tablet.recordTap({ caseId, kind: 'scope_in', payload: {} });

    refusing = false;
    tablet.setAuthor(author); // signed in again
    await acceptedOn(tablet, caseId, tap.id);
    expect(tablet.status.getSnapshot().sessionEnded).toBe(false);
  });

  it('lets a case go from memory when its last screen closes it, and shows it all again when reopened', async () => {
    server = await startTestSyncServer();
    const { caseId, tablet: a } = await connectedTablet(server);
    const b = startTablet(server.url, { dbName: newDbName() });
    await Promise.all([a.openCase(caseId), a.openCase(caseId), b.openCase(caseId)]); // two screens on A
    const mine = await a.recordTap({ caseId, kind: 'clip_fired', payload: { outcome: 'deployed' } });
    const theirs = await b.recordTap({ caseId, kind: 'bleed', payload: {} });
    const accepted = () => a.caseView(caseId).getSnapshot().items.filter((i) => i.state === 'accepted').map((i) => i.id).sort();
    await eventually(() => expect(accepted()).toEqual([mine.id, theirs.id].sort()));

    a.closeCase(caseId); // one screen of two: still shown
    await new Promise((r) => setTimeout(r, 20));
    expect(a.casesInMemory()).toContain(caseId);
    a.closeCase(caseId);
    await eventually(() => expect(a.casesInMemory()).not.toContain(caseId));
    expect(a.caseView(caseId).getSnapshot().loaded).toBe(false);

    // A tap on B meanwhile: reopened, A reads its own copy back from IndexedDB and catches up with the rest.
    const later = await b.recordTap({ caseId, kind: 'haemostasis', payload: { achieved: true } });
    await a.openCase(caseId);
    await eventually(() => expect(accepted()).toEqual([mine.id, theirs.id, later.id].sort()));
  });

  it('keeps a case in memory while something still listens to it', async () => {
    server = await startTestSyncServer();
    const { caseId, tablet } = await connectedTablet(server);
    const stop = tablet.caseView(caseId).subscribe(() => undefined);
    await tablet.openCase(caseId);
    tablet.closeCase(caseId);
    await new Promise((r) => setTimeout(r, 20));
    expect(tablet.casesInMemory()).toContain(caseId);
    stop();
  });

  it('does not stay in the room of a case closed again before its join began', async () => {
    server = await startTestSyncServer();
    const { caseId, tablet } = await connectedTablet(server);
    const opening = tablet.openCase(caseId);
    tablet.closeCase(caseId); // the screen left at once
    await opening;
    await new Promise((r) => setTimeout(r, 50));
    expect((await server.io.in(caseRoom(caseId)).fetchSockets()).length).toBe(0);
  });
});
