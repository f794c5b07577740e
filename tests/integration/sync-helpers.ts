import pino from 'pino';
import { io as connect, type Socket } from 'socket.io-client';
import { v7 as uuidv7 } from 'uuid';
import { startServer, type RunningServer } from '#server/server.ts';
import type { ClientToServerEvents, ServerToClientEvents, EventsRecorded } from '#shared/contracts/sync.ts';
import type { EventKind, NewEventOf } from '#shared/schemas/events.ts';
import { buildCase, buildTeam, signIn } from './factories.ts';
import type { TestContext } from './helpers/app.ts';
import { buildEvent } from '../factories/events.ts';

export type TestSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

const nodes: RunningServer[] = [];
const sockets: TestSocket[] = [];

/** A server node (HTTP + Socket.IO) on a free loopback port over the test database, with any settings changed. */
export async function startNode(t: TestContext, overrides: Partial<TestContext['config']> = {}): Promise<RunningServer> {
  const node = await startServer({ ...t.config, ...overrides, HOST: '127.0.0.1', PORT: 0 }, { logger: pino({ level: 'silent' }) });
  nodes.push(node);
  return node;
}

/** A tablet's socket with a session cookie (and any other headers), connected (rejects with the refusal when not allowed in). */
export async function tablet(url: string, cookie?: string, headers: Record<string, string> = {}): Promise<TestSocket> {
  const socket: TestSocket = connect(url, { transports: ['websocket'], reconnection: false, extraHeaders: { ...headers, ...(cookie ? { cookie } : {}) } });
  sockets.push(socket);
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', (err) => reject(err));
  });
  return socket;
}

/** Close every socket and node the test started. */
export async function stopAll(): Promise<void> {
  for (const s of sockets.splice(0)) s.disconnect();
  await Promise.all(nodes.splice(0).map((n) => n.close()));
}

const ACK_MS = 10_000;
export const push = (s: TestSocket, caseId: string, events: unknown[]) =>
  s.timeout(ACK_MS).emitWithAck('events.push', { caseId, events } as never);
export const join = (s: TestSocket, caseId: string, afterSeq = 0) => s.timeout(ACK_MS).emitWithAck('case.join', { caseId, afterSeq });

/** Every `events.recorded` a socket receives, in order. */
export function recordedBy(s: TestSocket): EventsRecorded[] {
  const seen: EventsRecorded[] = [];
  s.on('events.recorded', (m) => seen.push(m));
  return seen;
}

/** A unit with one member of each role, each signed in (built once per file: sign-up and sign-in hash passwords). */
export async function signedInTeam(t: TestContext) {
  const team = await buildTeam(t);
  const { nurse, endoscopist, supervisor, admin } = team.members;
  const [n, e, s, a] = await Promise.all([nurse, endoscopist, supervisor, admin].map((m) => signIn(t, m)));
  return { ...team, cookies: { nurse: n!, endoscopist: e!, supervisor: s!, admin: a! } };
}
export type SignedInTeam = Awaited<ReturnType<typeof signedInTeam>>;

/** A new scheduled case of the team's unit (each test records in its own case). */
export async function newCase(t: TestContext, team: SignedInTeam): Promise<string> {
  const row = await buildCase(t, team.unit, { nurse: team.members.nurse, endoscopist: team.members.endoscopist });
  return row.id;
}

/** A valid event of this case tapped by `author` on `device`. */
export function tap<K extends EventKind>(kind: K, caseId: string, author: string, over: Partial<Omit<NewEventOf<K>, 'kind'>> = {}): NewEventOf<K> {
  return buildEvent(kind, { caseId, author, device: 'tablet-room-1', deviceTime: new Date().toISOString(), ...over });
}

export const newId = () => uuidv7();
