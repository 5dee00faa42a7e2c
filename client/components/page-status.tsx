/** What a page shows while its data loads. */
export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="flex items-center gap-2 py-8 text-ink-soft">
      <span className="inline-block size-3 animate-pulse rounded-full bg-amber" aria-hidden="true" />
      {label}
    </p>
  );
}
