import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** One e-mail caught by the local capture. */
export interface CapturedMessage {
  id: number;
  to: string;
  from: string;
  subject: string;
  receivedAt: string;
  text: string;
  html: string;
  /** Attached files as received (tests read the bytes; the Outbox lists their names and sizes). */
  attachments: CapturedAttachment[];
}

export interface CapturedAttachment {
  filename: string;
  contentType: string;
  size: number;
  content: Buffer;
}

/** The capture's in-memory mailbox, read by the Outbox endpoints and by tests. */
export class Outbox {
  private readonly messages: CapturedMessage[] = [];
  private readonly waiters = new Set<() => void>();
  private nextId = 1;

  add(message: Omit<CapturedMessage, 'id'>): CapturedMessage {
    const stored = { id: this.nextId++, ...message };
    this.messages.push(stored);
    for (const wake of this.waiters) wake();
    return stored;
  }

  /** Newest first. */
  list(): CapturedMessage[] {
    return [...this.messages].reverse();
  }

  get(id: number): CapturedMessage | undefined {
    return this.messages.find((message) => message.id === id);
  }

  clear(): void {
    this.messages.length = 0;
  }

  /**
   * Resolves with the newest message matching `match` (e.g. sent to an address), waiting up to
   * `timeoutMs` for it to arrive; rejects naming what it waited for.
   */
  waitFor(match: (message: CapturedMessage) => boolean, timeoutMs = 5000): Promise<CapturedMessage> {
    const found = () => this.list().find(match);
    const now = found();
    if (now) return Promise.resolve(now);
    return new Promise((resolve, reject) => {
      const wake = () => {
        const message = found();
        if (!message) return;
        cleanup();
        resolve(message);
      };
      const timer = setTimeout(() => {
        cleanup();
        reject(new Error(`No matching e-mail arrived within ${timeoutMs} ms (outbox holds ${this.messages.length})`));
      }, timeoutMs);
      const cleanup = () => {
        clearTimeout(timer);
        this.waiters.delete(wake);
      };
      this.waiters.add(wake);
    });
  }
}

export interface CaptureServer {
  port: number;
  /** Give this to `createSmtpMailer`. */
  smtpUrl: string;
  outbox: Outbox;
  close(): Promise<void>;
}

/**
 * Starts a local SMTP server on loopback that keeps every message it receives in memory
 * (development and tests; PRODUCT.md capability 9). No TLS and no authentication: it listens
 * on 127.0.0.1 only. Port 0 picks a free port.
 */
export function startCaptureServer(options: { port?: number; now?: () => Date } = {}): Promise<CaptureServer> {
  const outbox = new Outbox();
  const now = options.now ?? (() => new Date());
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    banner: 'Bellwether local mail capture',
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const recipients = session.envelope.rcptTo.map((address) => address.address);
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : (parsed.from?.text ?? '');
          outbox.add({
            to: recipients.join(', '),
            from: parsed.from?.text ?? from,
            subject: parsed.subject ?? '',
            receivedAt: now().toISOString(),
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            attachments: parsed.attachments.map((attachment) => ({
              filename: attachment.filename ?? 'attachment',
              contentType: attachment.contentType,
              size: attachment.size,
              content: attachment.content,
            })),
          });
          // Answer only after storing, so the sender's `send` resolves once the message is readable.
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => {
      const address = server.server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      resolve({
        port,
        smtpUrl: `smtp://127.0.0.1:${port}`,
        outbox,
        close: () => new Promise<void>((done) => server.close(() => done())),
      });
    });
  });
}
