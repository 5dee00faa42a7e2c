import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Loading } from '../../components/page-status';
import { meQueryOptions } from '../../features/auth/api/get-me';
import { useUpdateAccount } from '../../features/auth/api/update-account';
import { notices } from '../../lib/notices';

/** The signed-in account: who it is, and whether review requests are e-mailed to it. */
export default function AccountRoute() {
  // Asked afresh: the answer to a sign-in does not carry the settings.
  const { data: me } = useQuery({ ...meQueryOptions(), staleTime: 0 });
  const update = useUpdateAccount({
    onSuccess: (account) =>
      notices.post({
        tone: 'success',
        title: 'Settings saved',
        message: account.notifyReviews ? 'Review requests will be e-mailed to you.' : 'Review requests will no longer be e-mailed to you.',
      }),
  });
  // The value being saved, set in the click itself: the box shows it at once (the mutation's own state
  // reaches the screen a moment later), and the saved or restored value once the answer is in.
  const [saving, setSaving] = useState<boolean | null>(null);
  if (!me || me.notifyReviews === undefined) return <Loading label="Loading your settings…" />;
  const on = saving ?? me.notifyReviews;
  return (
    <div className="flex max-w-2xl flex-col gap-6">
      <header>
        <h1 className="text-2xl font-extrabold tracking-tight sm:text-3xl">Your account</h1>
        <p className="mt-1 text-ink-soft">
          {me.displayName} · <span className="numeric">{me.email}</span>
        </p>
      </header>
      <section aria-labelledby="mail-title" className="rounded-2xl border border-rule bg-card p-5 shadow-xs">
        <h2 id="mail-title" className="mb-3 text-lg font-extrabold">
          E-mail
        </h2>
        <label className="flex items-start gap-3">
          <input
            type="checkbox"
            className="mt-1 size-4 accent-teal-deep"
            checked={on}
            disabled={saving !== null}
            onChange={(event) => {
              const notifyReviews = event.target.checked;
              setSaving(notifyReviews);
              update.mutate({ notifyReviews }, { onSettled: () => setSaving(null) });
            }}
          />
          <span>
            <span className="font-semibold">E-mail me when a snapshot in one of my rooms is marked for review</span>
            <span className="block text-sm text-ink-soft">One message per snapshot, with its headline figures and a link to the room.</span>
          </span>
        </label>
      </section>
    </div>
  );
}
