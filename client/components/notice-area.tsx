import { useNotices, notices as defaultStore, type NoticeStore, type NoticeTone } from '../lib/notices';
import { cx } from '../lib/cx';

const tones: Record<NoticeTone, string> = {
  error: 'border-coral/60 bg-coral-soft text-coral-deep',
  success: 'border-teal/50 bg-teal-soft text-teal-deep',
  info: 'border-rule bg-card text-ink',
};

/**
 * Where API errors and confirmations appear: bottom right, newest last, each dismissible. Errors
 * are announced assertively, the rest politely.
 */
export function NoticeArea({ store = defaultStore }: { store?: NoticeStore }) {
  const list = useNotices(store);
  return (
    <section aria-label="Notices" className="pointer-events-none fixed right-4 bottom-4 z-50 flex w-[min(24rem,calc(100vw-2rem))] flex-col gap-2">
      {list.map((notice) => (
        <div
          key={notice.id}
          role={notice.tone === 'error' ? 'alert' : 'status'}
          className={cx('pointer-events-auto flex items-start gap-3 rounded-xl border px-4 py-3 shadow-md', tones[notice.tone])}
        >
          <div className="min-w-0 flex-1">
            <p className="font-bold">{notice.title}</p>
            {notice.message && <p className="text-sm break-words">{notice.message}</p>}
          </div>
          <button
            type="button"
            onClick={() => store.dismiss(notice.id)}
            className="-mr-1 rounded-md px-1.5 text-lg leading-none opacity-70 hover:opacity-100"
            aria-label={`Dismiss: ${notice.title}`}
          >
            ×
          </button>
        </div>
      ))}
    </section>
  );
}
