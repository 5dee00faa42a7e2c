import { cx } from '../lib/cx';

/** The Matchloom mark (the favicon's paper disc with a teal loop and an amber sweep woven through each other) and the name. */
export function Wordmark({ className, size = 28 }: { className?: string; size?: number }) {
  return (
    <span className={cx('inline-flex items-center gap-2 leading-none', className)}>
      <svg viewBox="0 0 64 64" width={size} height={size} aria-hidden="true" focusable="false" className="shrink-0">
        <circle cx="32" cy="32" r="28" fill="var(--color-paper)" stroke="var(--color-ink)" strokeWidth="3" />
        <path d="M7 32h50" stroke="var(--color-ink)" strokeOpacity=".28" strokeWidth="2" />
        <circle cx="39" cy="32" r="13" fill="none" stroke="var(--color-teal)" strokeWidth="6" />
        <path d="M12 44C22 24 40 16 52 18" fill="none" stroke="var(--color-paper)" strokeWidth="10" strokeLinecap="round" />
        <path d="M12 44C22 24 40 16 52 18" fill="none" stroke="var(--color-amber)" strokeWidth="6" strokeLinecap="round" />
        <path d="M35.86 19.39A13 13 0 0 1 43.66 19.86" fill="none" stroke="var(--color-paper)" strokeWidth="10" />
        <path d="M34.55 19.78A13 13 0 0 1 44.90 20.42" fill="none" stroke="var(--color-teal)" strokeWidth="6" />
      </svg>
      <span className="text-xl font-extrabold tracking-tight">
        Match<span className="text-teal-deep">loom</span>
      </span>
    </span>
  );
}
