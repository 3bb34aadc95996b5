import { escapeHtml, linkifyText } from './html.js';
import type { StoredMessage } from './message.js';

const STYLE = `
  body { font: 15px/1.45 system-ui, sans-serif; margin: 0; color: #1f2328; background: #f6f7f9; }
  header { background: #2f5d3a; color: #fff; padding: .75rem 1.25rem; display: flex; gap: 1rem; align-items: baseline; }
  header a { color: #fff; text-decoration: none; font-weight: 600; }
  header small { opacity: .8; }
  main { max-width: 1100px; margin: 1.25rem auto; padding: 0 1rem; }
  table { width: 100%; border-collapse: collapse; background: #fff; border: 1px solid #d8dce1; }
  th, td { text-align: left; padding: .5rem .75rem; border-bottom: 1px solid #e6e8eb; vertical-align: top; }
  th { background: #eef0f3; font-weight: 600; font-size: 13px; }
  td.when { white-space: nowrap; color: #57606a; font-size: 13px; }
  tr:hover td { background: #f3f8f4; }
  a { color: #1a5fb4; }
  .empty { background: #fff; border: 1px solid #d8dce1; padding: 2rem; text-align: center; color: #57606a; }
  .card { background: #fff; border: 1px solid #d8dce1; padding: 1rem 1.25rem; margin-bottom: 1rem; }
  h1 { font-size: 1.3rem; margin: 0 0 .75rem; }
  h2 { font-size: 1rem; margin: 0 0 .5rem; }
  dl { display: grid; grid-template-columns: max-content 1fr; gap: .25rem 1rem; margin: 0; }
  dt { color: #57606a; }
  dd { margin: 0; word-break: break-word; }
  iframe { width: 100%; height: 60vh; border: 1px solid #e6e8eb; resize: vertical; background: #fff; }
  pre { white-space: pre-wrap; word-break: break-word; margin: 0; font: 13px/1.5 ui-monospace, monospace; }
  ul { margin: 0; padding-left: 1.25rem; }
`;

// Pages carry no script at all; the mail HTML inherits this policy inside its srcdoc frame, so only images and inline styles load.
export const PAGE_SECURITY_POLICY = "default-src 'none'; img-src http: https: data:; style-src 'unsafe-inline'; frame-src 'self'; form-action 'none'";

function page(title: string, body: string, refreshSeconds?: number): string {
  const refresh = refreshSeconds ? `<meta http-equiv="refresh" content="${refreshSeconds}">` : '';
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">${refresh}
<title>${escapeHtml(title)}</title><style>${STYLE}</style></head>
<body><header><a href="/">Hitchbook mail catcher</a><small>Local inbox: nothing here leaves this machine</small></header>
<main>${body}</main></body></html>`;
}

function when(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 19)} UTC`;
}

export function renderInbox(messages: StoredMessage[]): string {
  if (messages.length === 0) {
    return page('Inbox (0)', '<p class="empty">No mail yet. This page refreshes every 5 seconds.</p>', 5);
  }
  const rows = messages
    .map(
      (m) => `<tr>
<td class="when">${escapeHtml(when(m.date))}</td>
<td>${escapeHtml(m.from)}</td>
<td>${escapeHtml(m.to.join(', '))}</td>
<td><a href="/messages/${encodeURIComponent(m.id)}">${escapeHtml(m.subject || '(no subject)')}</a>${
        m.attachments.length ? ` <small>(${m.attachments.length} attachment${m.attachments.length === 1 ? '' : 's'})</small>` : ''
      }</td>
</tr>`,
    )
    .join('\n');
  return page(
    `Inbox (${messages.length})`,
    `<table><thead><tr><th>Received</th><th>From</th><th>To</th><th>Subject</th></tr></thead><tbody>
${rows}
</tbody></table><p><small>Newest first; refreshes every 5 seconds.</small></p>`,
    5,
  );
}

export function renderMessage(m: StoredMessage): string {
  const attachments = m.attachments.length
    ? `<section class="card"><h2>Attachments</h2><ul>${m.attachments
        .map(
          (a) =>
            `<li><a href="/api/messages/${encodeURIComponent(m.id)}/attachments/${a.index}" download="${escapeHtml(a.filename)}">${escapeHtml(
              a.filename,
            )}</a> <small>${escapeHtml(a.contentType)}, ${formatSize(a.size)}</small></li>`,
        )
        .join('')}</ul></section>`
    : '';
  // Links open in a new tab that escapes the sandbox, so a sign-in or payment link works as it would in a real mail client.
  const html =
    m.html === null
      ? ''
      : `<section class="card"><h2>HTML</h2><iframe title="HTML body" sandbox="allow-popups allow-popups-to-escape-sandbox" referrerpolicy="no-referrer" srcdoc="${escapeHtml(
          `<base target="_blank">${m.html}`,
        )}"></iframe></section>`;
  const text = m.text ? `<section class="card"><h2>Text</h2><pre>${linkifyText(m.text)}</pre></section>` : '';
  const headers = Object.entries(m.headers)
    .map(([name, value]) => `<dt>${escapeHtml(name)}</dt><dd><pre>${escapeHtml(value)}</pre></dd>`)
    .join('');
  return page(
    m.subject || '(no subject)',
    `<p><a href="/">&larr; Inbox</a></p>
<section class="card"><h1>${escapeHtml(m.subject || '(no subject)')}</h1><dl>
<dt>From</dt><dd>${escapeHtml(m.from)}</dd>
<dt>To</dt><dd>${escapeHtml(m.to.join(', '))}</dd>
<dt>Received</dt><dd>${escapeHtml(when(m.date))}</dd>
</dl></section>
${attachments}${html}${text}
<section class="card"><details><summary>Headers</summary><dl>${headers}</dl></details></section>`,
  );
}

export function renderNotFound(what: string): string {
  return page('Not found', `<p class="empty">${escapeHtml(what)}</p><p><a href="/">&larr; Inbox</a></p>`);
}

function formatSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
