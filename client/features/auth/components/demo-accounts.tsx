import { DEMO_PASSWORD, DEMO_USERS } from '../../../../shared/demo/designs';

/** The demo accounts the server seeds (PRODUCT.md "The demo scenario"); choosing one fills the sign-in form. */
export function DemoAccounts({ onPick }: { onPick: (account: { email: string; password: string }) => void }) {
  return (
    <section aria-labelledby="demo-accounts-title" className="rounded-xl border border-dashed border-amber bg-amber-soft/60 p-4">
      <h2 id="demo-accounts-title" className="text-sm font-bold text-amber-deep">
        Demo accounts
      </h2>
      <p className="mt-1 text-sm text-ink-soft">
        Each opens the demo rooms in a different role. Pick one to fill the form; the password is{' '}
        <code className="numeric rounded bg-card px-1 text-ink">{DEMO_PASSWORD}</code>.
      </p>
      <ul className="mt-3 flex flex-col gap-1.5">
        {DEMO_USERS.map((account) => (
          <li key={account.email}>
            <button
              type="button"
              onClick={() => onPick({ email: account.email, password: DEMO_PASSWORD })}
              className="flex w-full items-center justify-between gap-3 rounded-lg border border-rule bg-card px-3 py-1.5 text-left text-sm hover:border-ink-faint"
              aria-label={`Use the demo ${account.role} account, ${account.email}`}
            >
              <span className="numeric text-ink">{account.email}</span>
              <span className="text-xs font-bold tracking-wide text-ink-faint uppercase">{account.role}</span>
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}
