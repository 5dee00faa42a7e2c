import { dateFrom, dateTimeLabel, timeAgo } from '../../../lib/format-time';
import type { MailboxMessage } from '../api/get-mailbox';
import { linkedText } from './linked-text';

function MessageText({ text }: { text: string }) {
  return (
    <p className="text-sm whitespace-pre-wrap break-words text-ink">
      {linkedText(text).map((run, i) =>
        run.kind === 'link' ? (
          <a key={i} href={run.href} className="font-semibold text-teal-deep underline underline-offset-2">
            {run.text}
          </a>
        ) : (
          <span key={i}>{run.text}</span>
        ),
      )}
    </p>
  );
}

/** The fake mail server's messages, newest first; the plain-text body is shown, with its addresses as links. */
export function MailboxList({ messages }: { messages: readonly MailboxMessage[] }) {
  if (!messages.length)
    return <p className="rounded-xl border border-dashed border-rule bg-card px-4 py-6 text-ink-soft">No mail yet. Invite someone who has no account, or mark a snapshot for review.</p>;
  return (
    <ol aria-label="Messages" className="flex flex-col gap-3">
      {messages.map((message, i) => {
        const date = dateFrom(message.sentAt);
        return (
          <li key={`${message.sentAt}-${i}`} className="rounded-xl border border-rule bg-card p-4 shadow-xs">
            <article aria-label={message.subject}>
              <header className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
                <h2 className="font-extrabold">{message.subject}</h2>
                {date && (
                  <time dateTime={date.toISOString()} title={dateTimeLabel(date)} className="text-xs text-ink-faint">
                    {timeAgo(date)}
                  </time>
                )}
              </header>
              <p className="mb-2 text-xs text-ink-soft">
                To <span className="numeric">{message.to}</span>
              </p>
              <MessageText text={message.text} />
            </article>
          </li>
        );
      })}
    </ol>
  );
}
