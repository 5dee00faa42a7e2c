import { cx } from '../lib/cx';

/** The Matchloom mark (a paper disc crossed by woven arcs) and the name set in Nunito Sans. */
export function Wordmark({ className, size = 28 }: { className?: string; size?: number }) {
  return (
    <span className={cx('inline-flex items-center gap-2 leading-none', className)}>
      <svg viewBox="0 0 64 64" width={size} height={size} aria-hidden="true" focusable="false" className="shrink-0">
        <circle cx="32" cy="32" r="27" fill="var(--color-paper)" stroke="var(--color-ink)" strokeWidth="3" />
        <path d="M9 32h46" stroke="var(--color-ink)" strokeWidth="2" strokeOpacity=".3" />
        <path d="M55 32a15 15 0 0 0-30 0a7.5 7.5 0 0 0 15 0" fill="none" stroke="var(--color-teal)" strokeWidth="4.5" strokeLinecap="round" />
        <path d="M14 20c8 10 18 14 30 2" fill="none" stroke="var(--color-coral)" strokeWidth="4" strokeLinecap="round" />
        <path d="M14 44c8-10 18-14 30-2" fill="none" stroke="var(--color-amber)" strokeWidth="4" strokeLinecap="round" />
      </svg>
      <span className="text-xl font-extrabold tracking-tight">
        Match<span className="text-teal-deep">loom</span>
      </span>
    </span>
  );
}
