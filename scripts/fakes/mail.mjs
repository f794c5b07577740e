// The local mail fake: an SMTP server on loopback that keeps every message it receives (raw .eml and
// parsed .json in one folder), and a small reading page with a JSON API that the browser tests use to
// fetch invitation and reset links. Run it as `node scripts/fakes/mail.mjs --smtp-port 2525
// --web-port 2580 --dir .data/mail`, or in-process with startMailFake().
import { createServer } from 'node:http';
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { randomBytes } from 'node:crypto';
import { pathToFileURL } from 'node:url';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { renderIndex, renderMessage } from './mail-page.mjs';

const MAX_SIZE = 25 * 1024 * 1024;

/** Every link in a message, from the plain text and from the HTML part's hrefs, in order, once each. */
export function extractLinks(text, html) {
  const found = [];
  for (const m of (text || '').matchAll(/https?:\/\/[^\s<>"'\])]+/g)) found.push(m[0].replace(/[.,;:!?]+$/, ''));
  for (const m of (html || '').matchAll(/href\s*=\s*["']([^"']+)["']/gi)) found.push(m[1].replaceAll('&amp;', '&'));
  return [...new Set(found.filter((l) => /^https?:\/\//.test(l)))];
}

const addresses = (field) => (Array.isArray(field) ? field : field ? [field] : [])
  .flatMap((f) => f.value ?? []).map((a) => a.address?.toLowerCase()).filter(Boolean);

/** The stored (JSON) form of one received message. */
async function toRecord(raw, session) {
  const parsed = await simpleParser(raw);
  const html = typeof parsed.html === 'string' ? parsed.html : null;
  const receivedAt = new Date();
  return {
    id: `${receivedAt.getTime().toString().padStart(14, '0')}-${randomBytes(3).toString('hex')}`,
    receivedAt: receivedAt.toISOString(),
    envelope: {
      from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
      to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
    },
    from: parsed.from?.text ?? '',
    to: addresses(parsed.to),
    cc: addresses(parsed.cc),
    subject: parsed.subject ?? '',
    date: (parsed.date ?? receivedAt).toISOString(),
    messageId: parsed.messageId ?? null,
    text: parsed.text ?? '',
    html,
    links: extractLinks(parsed.text, html),
    attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? null, contentType: a.contentType, size: a.size })),
  };
}

const isFor = (message, to) => {
  const want = to.trim().toLowerCase();
  return [...message.envelope.to, ...message.to, ...message.cc].includes(want);
};

/**
 * Start the SMTP server and the reading page. Port 0 picks a free port (the tests do this).
 * Returns { smtpPort, webPort, messages(to?), close() }.
 */
export async function startMailFake({ smtpPort, webPort, dir, host = '127.0.0.1', log = () => {} }) {
  dir = resolve(dir);
  mkdirSync(dir, { recursive: true });
  /** Newest last; the folder is the source of truth across restarts. */
  const store = readdirSync(dir).filter((f) => f.endsWith('.json')).sort()
    .map((f) => JSON.parse(readFileSync(join(dir, f), 'utf8')));

  const smtp = new SMTPServer({
    banner: 'Ledgerline local mail fake',
    authOptional: true,
    allowInsecureAuth: true,
    disabledCommands: ['STARTTLS'],
    size: MAX_SIZE,
    logger: false,
    closeTimeout: 2000,
    // Any credentials are accepted: the fake stands in for a relay, it protects nothing.
    onAuth: (auth, _session, cb) => cb(null, { user: auth.username }),
    onData(stream, session, cb) {
      const chunks = [];
      stream.on('data', (c) => chunks.push(c));
      stream.on('error', cb);
      stream.on('end', async () => {
        if (stream.sizeExceeded) return cb(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        try {
          const raw = Buffer.concat(chunks);
          const record = await toRecord(raw, session);
          writeFileSync(join(dir, `${record.id}.eml`), raw);
          writeFileSync(join(dir, `${record.id}.json`), `${JSON.stringify(record, null, 2)}\n`);
          store.push(record);
          log(`mail: "${record.subject}" to ${record.envelope.to.join(', ')}`);
          cb();
        } catch (err) {
          cb(err);
        }
      });
    },
  });
  smtp.on('error', (err) => log(`mail fake SMTP error: ${err.message}`));

  const list = (to) => (to ? store.filter((m) => isFor(m, to)) : store).slice().reverse();
  const web = createServer((req, res) => {
    try {
      handle(req, res);
    } catch (err) {
      send(res, 500, 'text/plain; charset=utf-8', String(err?.message ?? err));
    }
  });
  const send = (res, status, type, body) => {
    res.writeHead(status, { 'content-type': type, 'cache-control': 'no-store' });
    res.end(body);
  };
  const json = (res, status, body) => send(res, status, 'application/json; charset=utf-8', JSON.stringify(body));
  function handle(req, res) {
    const url = new URL(req.url ?? '/', 'http://fake');
    const parts = url.pathname.split('/').filter(Boolean);
    const byId = (id) => store.find((m) => m.id === id);
    if (req.method === 'GET' && url.pathname === '/') return send(res, 200, 'text/html; charset=utf-8', renderIndex(list(url.searchParams.get('to'))));
    if (req.method === 'GET' && parts[0] === 'messages' && parts.length === 2) {
      const eml = parts[1].endsWith('.eml');
      const m = byId(eml ? parts[1].slice(0, -4) : parts[1]);
      if (!m) return send(res, 404, 'text/plain; charset=utf-8', 'No such message');
      if (eml) return send(res, 200, 'message/rfc822', readFileSync(join(dir, `${m.id}.eml`)));
      return send(res, 200, 'text/html; charset=utf-8', renderMessage(m));
    }
    if (parts[0] === 'api' && parts[1] === 'messages') {
      if (req.method === 'GET' && parts.length === 2) return json(res, 200, list(url.searchParams.get('to')));
      if (req.method === 'GET' && parts.length === 3) {
        const m = byId(parts[2]);
        return m ? json(res, 200, m) : json(res, 404, { error: 'No such message' });
      }
      if (req.method === 'DELETE' && parts.length === 2) {
        for (const f of readdirSync(dir)) if (/\.(json|eml)$/.test(f)) rmSync(join(dir, f));
        store.length = 0;
        return json(res, 200, { deleted: true });
      }
    }
    return send(res, 404, 'text/plain; charset=utf-8', 'Not found');
  }

  await new Promise((ok, fail) => { smtp.server.once('error', fail); smtp.listen(smtpPort, host, ok); });
  await new Promise((ok, fail) => { web.once('error', fail); web.listen(webPort, host, ok); });
  return {
    smtpPort: smtp.server.address().port,
    webPort: web.address().port,
    messages: list,
    async close() {
      web.closeAllConnections();
      await Promise.all([new Promise((ok) => smtp.close(ok)), new Promise((ok) => web.close(() => ok()))]);
    },
  };
}

const flag = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 && process.argv[i + 1] ? process.argv[i + 1] : fallback;
};

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const fake = await startMailFake({
    smtpPort: Number(flag('smtp-port', '2525')),
    webPort: Number(flag('web-port', '2580')),
    dir: flag('dir', '.data/mail'),
    log: (line) => console.log(line),
  });
  console.log(`mail fake ready: smtp 127.0.0.1:${fake.smtpPort}, page http://127.0.0.1:${fake.webPort}`);
  const stop = async () => { await fake.close(); process.exit(0); };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
  // Started by scripts/start.mjs with an IPC channel: if that parent dies, so does the fake.
  process.once('disconnect', stop);
}
