import { cx } from '../../../lib/cx';

/** The side panel's compact buttons. */
export const smallButton = (tone: 'plain' | 'primary' | 'danger' = 'plain') =>
  cx(
    'inline-flex items-center justify-center gap-1 rounded-md px-2 py-1 text-xs font-semibold transition-colors',
    'disabled:cursor-not-allowed disabled:opacity-50',
    tone === 'primary' && 'bg-ink text-paper hover:bg-ink-soft',
    tone === 'plain' && 'border border-rule bg-card text-ink hover:border-ink-faint hover:bg-paper',
    tone === 'danger' && 'border border-coral/50 bg-card text-coral-deep hover:bg-coral-soft',
  );
