/**
 * A real SMTP service on the loopback interface (smtp-server), standing in for a hosted mail
 * provider in development and tests. Every message it receives is parsed (mailparser) and kept
 * in the `outbox_messages` table, filed under the firm named by the X-Deckshare-Firm header;
 * admins read it in the product (GET /api/mail/outbox). The message is stored before the
 * service answers "250 OK", so a sender whose `sendMail` resolved finds it in the outbox.
 *
 * Only the application may file messages: the service requires SMTP AUTH (PLAIN or LOGIN) with
 * a secret made at each start and handed to the application's mailer in memory (`auth`), so a
 * process that merely reaches the port cannot plant a message in a firm's outbox.
 */
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { AddressInfo } from 'node:net';
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from '../db/client.js';
import { firms, outboxMessages } from '../db/schema.js';
import { FIRM_HEADER, KIND_HEADER } from './mailer.js';

export interface LocalSmtp {
  host: string;
  port: number;
  /** The credentials the application's mailer signs in with (made at start, never stored). */
  auth: { user: string; pass: string };
  close(): Promise<void>;
}

const SMTP_USER = 'deckshare-app';

function sameSecret(given: string | null | undefined, expected: string): boolean {
  const a = Buffer.from(given ?? '');
  const b = Buffer.from(expected);
  return a.length === b.length && timingSafeEqual(a, b);
}

export interface LocalSmtpOptions {
  db: Db;
  /** Loopback only; default 127.0.0.1. */
  host?: string;
  /** 0 picks a free port. */
  port?: number;
  /** Largest message accepted, bytes (default 5 MB). */
  maxBytes?: number;
  log?: (line: string) => void;
}

function headerText(v: unknown): string {
  if (typeof v === 'string') return v.trim();
  if (Array.isArray(v)) return headerText(v[0]);
  return '';
}

export function startLocalSmtp(o: LocalSmtpOptions): Promise<LocalSmtp> {
  const host = o.host ?? '127.0.0.1';
  const maxBytes = o.maxBytes ?? 5 * 1024 * 1024;
  const log = o.log ?? (() => {});
  const secret = randomBytes(24).toString('base64url');
  const server = new SMTPServer({
    name: 'deckshare-local-smtp',
    banner: 'Deckshare local mail service (development and tests only)',
    disabledCommands: ['STARTTLS'],
    hideSTARTTLS: true,
    authMethods: ['PLAIN', 'LOGIN'],
    // loopback only, and the secret never leaves this process: plain-text AUTH is acceptable here
    allowInsecureAuth: true,
    authOptional: false,
    disableReverseLookup: true,
    size: maxBytes,
    logger: false,
    onAuth(auth, _session, callback) {
      if (auth.username === SMTP_USER && sameSecret(auth.password, secret)) return callback(null, { user: SMTP_USER });
      log('local SMTP: refused a sign-in that did not come from the application');
      return callback(Object.assign(new Error('authentication failed: this service accepts mail from the Deckshare application only'), { responseCode: 535 }));
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          if (stream.sizeExceeded) {
            const err = Object.assign(new Error(`message exceeds the ${maxBytes}-byte limit`), { responseCode: 552 });
            return callback(err);
          }
          const firmHeader = headerText(mail.headers.get(FIRM_HEADER.toLowerCase()));
          const firmId = /^\d+$/.test(firmHeader) ? Number(firmHeader) : null;
          const knownFirm = firmId !== null && o.db.select({ id: firms.id }).from(firms).where(eq(firms.id, firmId)).get() !== undefined;
          const to = session.envelope.rcptTo.map((r) => r.address).join(', ');
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
          o.db
            .insert(outboxMessages)
            .values({
              firmId: knownFirm ? firmId : null,
              kind: headerText(mail.headers.get(KIND_HEADER.toLowerCase())),
              messageId: mail.messageId ?? '',
              fromAddress: mail.from?.text ?? from,
              toAddresses: to,
              subject: mail.subject ?? '',
              textBody: mail.text ?? '',
              htmlBody: typeof mail.html === 'string' ? mail.html : null,
              sizeBytes: Number((stream as unknown as { byteLength?: number }).byteLength ?? 0) || Buffer.byteLength(mail.text ?? ''),
            })
            .run();
          callback();
        })
        .catch((e: unknown) => {
          log(`local SMTP: could not keep a message: ${e instanceof Error ? e.message : String(e)}`);
          callback(e instanceof Error ? e : new Error(String(e)));
        });
    },
  });
  let listening = false;
  // Errors before listening reject the start below; later ones are logged.
  server.on('error', (e) => {
    if (listening) log(`local SMTP: ${e.message}`);
  });
  return new Promise((resolve, reject) => {
    const onError = (e: Error) => reject(new Error(`the local SMTP service could not listen on ${host}:${o.port ?? 0}: ${e.message}`));
    server.server.once('error', onError);
    server.listen(o.port ?? 0, host, () => {
      server.server.off('error', onError);
      listening = true;
      const port = (server.server.address() as AddressInfo).port;
      resolve({
        host,
        port,
        auth: { user: SMTP_USER, pass: secret },
        close: () => new Promise<void>((done) => server.close(() => done())),
      });
    });
  });
}
