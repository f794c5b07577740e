// The mail fake's reading page: a list of received messages and one page per message with its text,
// its links and its HTML part in a sandboxed frame. Plain server-rendered HTML, no scripts.
const escape = (s) => String(s ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]);

const when = (iso) => new Date(iso).toISOString().replace('T', ' ').slice(0, 19) + ' UTC';

const layout = (title, body) => `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escape(title)}</title>
<style>
  body { font: 16px/1.45 system-ui, sans-serif; margin: 0; color: #1d232b; background: #f6f4ef; }
  header { padding: 12px 20px; background: #23403a; color: #fff; }
  header a { color: #fff; text-decoration: none; font-weight: 600; }
  main { padding: 16px 20px; max-width: 1100px; }
  table { border-collapse: collapse; width: 100%; background: #fff; }
  th, td { text-align: left; padding: 8px 10px; border-bottom: 1px solid #e2ddd2; vertical-align: top; }
  th { font-size: 13px; text-transform: uppercase; letter-spacing: .04em; color: #5a6270; }
  pre { white-space: pre-wrap; background: #fff; padding: 12px; border: 1px solid #e2ddd2; }
  iframe { width: 100%; height: 420px; border: 1px solid #e2ddd2; background: #fff; }
  dl { display: grid; grid-template-columns: max-content 1fr; gap: 4px 16px; }
  dt { color: #5a6270; }
  .empty { color: #5a6270; }
</style></head>
<body><header><a href="/">Ledgerline · local mail fake</a></header><main>${body}</main></body></html>`;

export function renderIndex(messages) {
  const rows = messages.map((m) => `<tr>
    <td>${escape(when(m.receivedAt))}</td><td>${escape(m.from)}</td><td>${escape(m.envelope.to.join(', '))}</td>
    <td><a href="/messages/${escape(m.id)}">${escape(m.subject || '(no subject)')}</a></td></tr>`).join('');
  const body = messages.length
    ? `<table><thead><tr><th>Received</th><th>From</th><th>To</th><th>Subject</th></tr></thead><tbody>${rows}</tbody></table>`
    : '<p class="empty">No messages yet. Mail sent to this SMTP server appears here.</p>';
  return layout(`Mail (${messages.length})`, `<h1>Received mail</h1>${body}`);
}

export function renderMessage(m) {
  const links = m.links.length
    ? `<ul>${m.links.map((l) => `<li><a href="${escape(l)}">${escape(l)}</a></li>`).join('')}</ul>`
    : '<p class="empty">No links.</p>';
  const html = m.html ? `<h2>HTML part</h2><iframe sandbox title="HTML part" srcdoc="${escape(m.html)}"></iframe>` : '';
  return layout(m.subject || '(no subject)', `<h1>${escape(m.subject || '(no subject)')}</h1>
  <dl><dt>From</dt><dd>${escape(m.from)}</dd><dt>To</dt><dd>${escape(m.envelope.to.join(', '))}</dd>
  <dt>Date</dt><dd>${escape(when(m.date))}</dd><dt>Raw</dt><dd><a href="/messages/${escape(m.id)}.eml">${escape(m.id)}.eml</a></dd></dl>
  <h2>Links</h2>${links}<h2>Text</h2><pre>${escape(m.text)}</pre>${html}`);
}
