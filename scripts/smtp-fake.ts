// Local stand-in for the hosted SMTP relay: accepts every message on loopback, stores
// it as .data/mail/<time>-<id>.eml and serves what was captured as JSON:
//   GET    http://127.0.0.1:8025/messages  → [{ id, file, date, from, to, subject, text, attachments }]
//   DELETE http://127.0.0.1:8025/messages  → removes every captured message
// STARTTLS is switched off so nodemailer talks plain SMTP to it; AUTH is optional. The
// JSON API answers only requests whose Host is loopback with its port and that carry no
// browser marks (scripts/lib/fake-guard.ts), so a page cannot read captured mail
// through DNS rebinding.
import fs from 'node:fs';
import path from 'node:path';
import http from 'node:http';
import { randomBytes } from 'node:crypto';
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import { mailApiRefusal } from './lib/fake-guard';
import { dataDir, portFromEnv, writePidFile } from './lib/pid-file';

const smtpPort = portFromEnv('KERFCAST_SMTP_PORT', 2525);
const httpPort = portFromEnv('KERFCAST_MAIL_HTTP_PORT', 8025);
const mailDir = path.join(dataDir, 'mail');
fs.mkdirSync(mailDir, { recursive: true });

const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  size: MAX_MESSAGE_BYTES,
  banner: 'Kerfcast local mail capture',
  onAuth(auth, _session, callback) {
    callback(null, { user: auth.username ?? 'local' });
  },
  onData(stream, _session, callback) {
    const chunks: Buffer[] = [];
    stream.on('data', (chunk: Buffer) => chunks.push(chunk));
    stream.on('error', (err) => callback(err));
    stream.on('end', () => {
      const id = randomBytes(6).toString('hex');
      const file = `${new Date().toISOString().replace(/[:.]/g, '-')}-${id}.eml`;
      fs.writeFile(path.join(mailDir, file), Buffer.concat(chunks), (err) => {
        if (err) return callback(err);
        console.log(`smtp-fake: stored ${file}`);
        callback(null, `queued as ${id}`);
      });
    });
  },
});

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : [];
  return list.flatMap((a) => a.value.map((v) => v.address ?? v.name)).filter(Boolean);
}

async function listMessages() {
  const files = (await fs.promises.readdir(mailDir)).filter((f) => f.endsWith('.eml')).sort();
  return Promise.all(
    files.map(async (file) => {
      const mail = await simpleParser(await fs.promises.readFile(path.join(mailDir, file)));
      return {
        id: file.replace(/\.eml$/, '').split('-').pop(),
        file,
        date: mail.date?.toISOString() ?? null,
        from: addresses(mail.from)[0] ?? null,
        to: addresses(mail.to),
        cc: addresses(mail.cc),
        subject: mail.subject ?? '',
        text: mail.text ?? '',
        html: typeof mail.html === 'string' ? mail.html : null,
        attachments: mail.attachments.map((a) => ({
          filename: a.filename ?? null,
          contentType: a.contentType,
          size: a.size,
        })),
      };
    }),
  );
}

const api = http.createServer((req, res) => {
  const send = (status: number, body: unknown) => {
    res.writeHead(status, { 'content-type': 'application/json' });
    res.end(JSON.stringify(body));
  };
  const refusal = mailApiRefusal(req, httpPort);
  if (refusal) return send(403, { error: refusal });
  const url = new URL(req.url ?? '/', `http://127.0.0.1:${httpPort}`);
  if (url.pathname !== '/messages') return send(404, { error: 'use /messages' });
  if (req.method === 'GET') {
    listMessages().then(
      (messages) => send(200, messages),
      (err: unknown) => send(500, { error: String(err) }),
    );
  } else if (req.method === 'DELETE') {
    fs.promises
      .readdir(mailDir)
      .then((files) =>
        Promise.all(files.filter((f) => f.endsWith('.eml')).map((f) => fs.promises.unlink(path.join(mailDir, f)))),
      )
      .then(
        (removed) => send(200, { deleted: removed.length }),
        (err: unknown) => send(500, { error: String(err) }),
      );
  } else {
    send(405, { error: 'GET or DELETE' });
  }
});

const close = (server: { close(cb: () => void): unknown }) => new Promise<void>((r) => server.close(() => r()));

smtp.on('error', (err) => console.error('smtp-fake: smtp error:', err.message));
smtp.listen(smtpPort, '127.0.0.1', () => {
  api.listen(httpPort, '127.0.0.1', () => {
    writePidFile('smtp-fake', async () => {
      await Promise.all([close(smtp), close(api)]);
    });
    console.log(`smtp-fake: SMTP on 127.0.0.1:${smtpPort}, mail list on http://127.0.0.1:${httpPort}/messages`);
  });
});
api.on('error', (err) => {
  console.error('smtp-fake: http error:', err.message);
  process.exit(1);
});
