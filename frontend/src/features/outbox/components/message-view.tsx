import { formatDateTime } from '@frontend/lib/format';
import type { OutboxMessage } from '../api/get-outbox-message';

/** Web addresses in the text version, so a developer can follow an invitation or reset link. */
export function linksIn(text: string | null): string[] {
  if (!text) return [];
  return [...new Set(text.match(/https?:\/\/[^\s<>"')\]]+/g) ?? [])];
}

/**
 * One captured e-mail: its headers, the links it carries, the text version as sent and the
 * HTML version in a sandboxed frame. `sandbox=""` grants nothing: no scripts, no forms, no
 * navigation of this page, and a unique origin, so a message cannot reach the app's cookies.
 */
export function MessageView({ message }: { message: OutboxMessage }) {
  const links = linksIn(message.text);
  return (
    <article aria-labelledby="message-subject" className="card p-4">
      <h2 id="message-subject" className="text-base">
        {message.subject || '(no subject)'}
      </h2>
      <dl className="mt-2 grid grid-cols-[5rem_1fr] gap-x-3 gap-y-0.5 text-sm">
        <dt className="text-slate-500">From</dt>
        <dd className="text-slate-800">{message.from}</dd>
        <dt className="text-slate-500">To</dt>
        <dd className="text-slate-800">{message.to}</dd>
        <dt className="text-slate-500">Received</dt>
        <dd className="text-slate-800 tabular-nums">{formatDateTime(message.receivedAt)}</dd>
      </dl>

      {links.length > 0 && (
        <section aria-labelledby="message-links" className="mt-4">
          <h3 id="message-links" className="text-sm">
            Links in this message
          </h3>
          <ul className="mt-1 space-y-0.5 text-sm">
            {links.map((link) => (
              <li key={link} className="break-all">
                <a href={link}>{link}</a>
              </li>
            ))}
          </ul>
        </section>
      )}

      {message.attachments && message.attachments.length > 0 && (
        <section aria-labelledby="message-attachments" className="mt-4">
          <h3 id="message-attachments" className="text-sm">
            Attachments
          </h3>
          <ul className="mt-1 space-y-0.5 text-sm">
            {message.attachments.map((attachment) => (
              <li key={attachment.filename}>
                {attachment.filename} ({attachment.contentType}, {Math.max(1, Math.round(attachment.size / 1024))} KB)
              </li>
            ))}
          </ul>
        </section>
      )}

      <section aria-labelledby="message-text" className="mt-4">
        <h3 id="message-text" className="text-sm">
          Text version
        </h3>
        {message.text ? (
          <pre className="mt-1 max-h-72 overflow-auto rounded border border-slate-200 bg-slate-50 p-3 font-sans text-sm whitespace-pre-wrap text-slate-800">
            {message.text}
          </pre>
        ) : (
          <p className="mt-1 text-sm text-slate-600">This message has no text version.</p>
        )}
      </section>

      <section aria-labelledby="message-html" className="mt-4">
        <h3 id="message-html" className="text-sm">
          HTML version
        </h3>
        {message.html ? (
          <iframe
            title={`HTML version of “${message.subject}”`}
            sandbox=""
            srcDoc={message.html}
            referrerPolicy="no-referrer"
            className="mt-1 h-96 w-full rounded border border-slate-200 bg-white"
          />
        ) : (
          <p className="mt-1 text-sm text-slate-600">This message has no HTML version.</p>
        )}
      </section>
    </article>
  );
}
