// The local mail catcher: an SMTP server on 127.0.0.1 that accepts every message and keeps it
// in .local/mail/ as .eml plus a JSON summary; a small HTTP page lists them for development.
// Nothing is ever relayed anywhere.
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { host, mail } from './lib/config.mjs';

fs.mkdirSync(mail.dataDir, { recursive: true });

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  onData(stream, session, callback) {
    const chunks = [];
    stream.on('data', (chunk) => chunks.push(chunk));
    const store = async () => {
      try {
        const raw = Buffer.concat(chunks);
        const parsed = await simpleParser(raw);
        const id = `${Date.now()}-${Math.random().toString(36).slice(2, 8)}`;
        const summary = {
          id,
          receivedAt: new Date().toISOString(),
          envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
          subject: parsed.subject ?? '',
          text: parsed.text ?? '',
          headers: Object.fromEntries([...parsed.headers].filter(([, v]) => typeof v === 'string')),
          attachments: parsed.attachments.map((a) => ({
            filename: a.filename,
            contentType: a.contentType,
            size: a.size,
          })),
        };
        fs.writeFileSync(path.join(mail.dataDir, `${id}.eml`), raw);
        fs.writeFileSync(path.join(mail.dataDir, `${id}.json`), JSON.stringify(summary, null, 2));
        callback();
      } catch (error) {
        callback(error);
      }
    };
    stream.on('end', () => void store());
  },
});

function listMessages() {
  return fs
    .readdirSync(mail.dataDir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => JSON.parse(fs.readFileSync(path.join(mail.dataDir, f), 'utf8')));
}

const escapeHtml = (s) =>
  String(s).replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]);

const web = http.createServer((req, res) => {
  const messages = listMessages();
  if (req.url === '/messages') {
    res.writeHead(200, { 'content-type': 'application/json' });
    res.end(JSON.stringify(messages));
    return;
  }
  const rows = messages
    .reverse()
    .map(
      (m) =>
        `<tr><td>${escapeHtml(m.receivedAt)}</td><td>${escapeHtml(m.envelopeTo.join(', '))}</td><td>${escapeHtml(m.subject)}</td><td><pre>${escapeHtml(m.text)}</pre></td></tr>`,
    )
    .join('');
  res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
  res.end(
    `<!doctype html><meta charset="utf-8"><title>Torquetrail mail catcher</title><h1>Caught mail (${messages.length})</h1><table border="1" cellpadding="4"><tr><th>Received</th><th>To</th><th>Subject</th><th>Text</th></tr>${rows}</table>`,
  );
});

smtp.listen(mail.smtpPort, host, () => {
  web.listen(mail.httpPort, host, () => {
    console.log(
      `[mail] SMTP catcher on ${host}:${mail.smtpPort}; messages at http://${host}:${mail.httpPort}/ (data ${mail.dataDir})`,
    );
  });
});

const shutdown = () => {
  smtp.close(() => web.close(() => process.exit(0)));
};
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
