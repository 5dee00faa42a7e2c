import type { ReactNode } from 'react';
import { Wordmark } from '../../../components/wordmark';

/** The frame of the signed-out pages: the wordmark, a line about the product, and one card. */
export function AuthLayout({ title, children, footer }: { title: string; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center justify-center px-4 py-10">
      <main className="w-full max-w-md">
        <div className="mb-6 flex flex-col items-center gap-2 text-center">
          <Wordmark size={36} />
          <p className="text-sm text-ink-soft">Shared, live rooms for designing impedance-matching networks.</p>
        </div>
        <div className="rounded-2xl border border-rule bg-card p-6 shadow-sm sm:p-8">
          <h1 className="mb-5 text-2xl font-extrabold tracking-tight">{title}</h1>
          {children}
        </div>
        {footer && <div className="mt-5 text-center text-sm text-ink-soft">{footer}</div>}
      </main>
    </div>
  );
}
