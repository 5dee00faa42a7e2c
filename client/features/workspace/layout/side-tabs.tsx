/**
 * The side panel's tabs: an ARIA tab list (arrow keys move between tabs) over one panel at a time.
 * Inactive panels stay mounted but hidden, so a search, a run in progress or an unapplied form
 * survives a look at another tab.
 */
import { useId, useRef, type KeyboardEvent, type ReactNode } from 'react';
import { cx } from '../../../lib/cx';

export interface SideTab<K extends string> {
  key: K;
  label: string;
  /** a small count or mark after the label */
  badge?: string | null;
  /** the badge in words, for screen readers ("2 others here") */
  badgeLabel?: string;
}

export interface SideTabsProps<K extends string> {
  tabs: readonly SideTab<K>[];
  active: K;
  onChange(key: K): void;
  panels: Record<K, ReactNode>;
  label: string;
}

export function SideTabs<K extends string>({ tabs, active, onChange, panels, label }: SideTabsProps<K>) {
  const base = useId();
  const refs = useRef<Record<string, HTMLButtonElement | null>>({});
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const i = tabs.findIndex((t) => t.key === active);
    let next = -1;
    if (e.key === 'ArrowRight' || e.key === 'ArrowDown') next = (i + 1) % tabs.length;
    else if (e.key === 'ArrowLeft' || e.key === 'ArrowUp') next = (i - 1 + tabs.length) % tabs.length;
    else if (e.key === 'Home') next = 0;
    else if (e.key === 'End') next = tabs.length - 1;
    if (next < 0) return;
    e.preventDefault();
    onChange(tabs[next].key);
    refs.current[tabs[next].key]?.focus();
  };
  return (
    <div className="flex min-h-0 flex-1 flex-col">
      <div role="tablist" aria-label={label} className="flex flex-wrap gap-1 border-b border-rule px-2 pt-2 pb-1.5" onKeyDown={onKeyDown}>
        {tabs.map((t) => {
          const selected = t.key === active;
          return (
            <button
              key={t.key}
              ref={(el) => {
                refs.current[t.key] = el;
              }}
              type="button"
              role="tab"
              id={`${base}-tab-${t.key}`}
              aria-selected={selected}
              aria-label={t.badge ? `${t.label}, ${t.badgeLabel ?? t.badge}` : undefined}
              aria-controls={`${base}-panel-${t.key}`}
              tabIndex={selected ? 0 : -1}
              onClick={() => onChange(t.key)}
              className={cx(
                'rounded-md px-2 py-1 text-xs font-semibold transition-colors',
                selected ? 'bg-ink text-paper' : 'text-ink-soft hover:bg-paper-deep hover:text-ink',
              )}
            >
              {t.label}
              {t.badge && <span aria-hidden="true" className={cx('ml-1 rounded-full px-1.5 text-[10px]', selected ? 'bg-paper/20' : 'bg-paper-deep')}>{t.badge}</span>}
            </button>
          );
        })}
      </div>
      {tabs.map((t) => (
        <div
          key={t.key}
          role="tabpanel"
          id={`${base}-panel-${t.key}`}
          aria-labelledby={`${base}-tab-${t.key}`}
          hidden={t.key !== active}
          tabIndex={0}
          className="min-h-0 flex-1 overflow-y-auto px-3 py-3 focus-visible:outline-offset-[-3px]"
        >
          {panels[t.key]}
        </div>
      ))}
    </div>
  );
}
