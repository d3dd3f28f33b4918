// lib/mail when the relay says no (issue 19 point 6): a relay of our own in this test, built
// on smtp-server, refuses some recipients (RFC 5321 §4.2.2: 550 mailbox unavailable), the
// whole message (554 transaction failed) or is not there at all. sendMail must report a
// partly refused message with its refused addresses, and fail, never pretend success, when
// nothing was accepted.
import net from 'node:net';
import { SMTPServer } from 'smtp-server';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { closeMailer, createTransport, sendMail } from '@/lib/mail/mailer';

const REFUSED = new Set(['gone@hollin-outdoor.example', 'full@hollin-outdoor.example']);
const mailer = globalThis as unknown as { kerfcastMailer?: ReturnType<typeof createTransport> };

let relay: SMTPServer;
let port = 0;
let delivered = 0;
let refuseData = false;

function relayError(message: string, responseCode: number): Error {
  return Object.assign(new Error(message), { responseCode });
}

beforeAll(async () => {
  relay = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onRcptTo(address, _session, callback) {
      if (REFUSED.has(address.address)) return callback(relayError('mailbox unavailable', 550));
      callback();
    },
    onData(stream, _session, callback) {
      stream.on('data', () => {});
      stream.on('end', () => {
        if (refuseData) return callback(relayError('transaction failed', 554));
        delivered++;
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => relay.listen(0, '127.0.0.1', () => resolve()));
  port = (relay.server.address() as net.AddressInfo).port;
});

afterAll(async () => {
  closeMailer();
  await new Promise<void>((resolve) => relay.close(() => resolve()));
});

function useRelay(url: string): void {
  closeMailer();
  mailer.kerfcastMailer = createTransport(url);
}

afterEach(() => {
  closeMailer();
  refuseData = false;
});

describe('sendMail against a relay that refuses', () => {
  it('one refused recipient of two: sent to the other, the refused one listed', async () => {
    useRelay(`smtp://127.0.0.1:${port}`);
    const before = delivered;
    const sent = await sendMail({ to: ['orders@marlow-street-bakery.example', 'gone@hollin-outdoor.example'], subject: 'Quote Q-1042', text: 'Our quote.\n' });
    expect(sent.accepted).toEqual(['orders@marlow-street-bakery.example']);
    expect(sent.rejected).toEqual(['gone@hollin-outdoor.example']);
    expect(delivered).toBe(before + 1);
  });

  it('every recipient refused: sendMail fails and nothing is delivered', async () => {
    useRelay(`smtp://127.0.0.1:${port}`);
    const before = delivered;
    await expect(sendMail({ to: ['gone@hollin-outdoor.example', 'full@hollin-outdoor.example'], subject: 'Quote Q-1043', text: 'Our quote.\n' })).rejects.toMatchObject({
      message: expect.stringMatching(/recipients were rejected/i),
    });
    expect(delivered).toBe(before);
  });

  it('the message refused after DATA (554): sendMail fails with the relay\u2019s code', async () => {
    useRelay(`smtp://127.0.0.1:${port}`);
    refuseData = true;
    await expect(sendMail({ to: 'lena@alder-finch.example', subject: 'Run sheet', text: 'Sheet 3 of 4.\n' })).rejects.toMatchObject({ responseCode: 554 });
  });

  it('no relay listening: sendMail fails (connection refused), it does not hang or resolve', async () => {
    const closed = net.createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', () => resolve()));
    const freePort = (closed.address() as net.AddressInfo).port;
    await new Promise((resolve) => closed.close(resolve));
    useRelay(`smtp://127.0.0.1:${freePort}`);
    await expect(sendMail({ to: 'ada@alder-finch.example', subject: 'Notice', text: 'Hello.\n' })).rejects.toMatchObject({ code: expect.stringMatching(/ECONNREFUSED|ESOCKET|ECONNECTION/) });
  });
});
