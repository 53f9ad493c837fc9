import { useState } from 'react';
import type { MeResponse } from '#shared/schemas/accounts';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { useLogin } from '../api/login';

/*
 * The invented demo circle's accounts (server/demo/demo-people.ts and demo-scenario.ts seed them on a
 * development server). Only shown when the server says it is not production.
 */
export const DEMO_PASSWORD = 'hilum-demo-seeds';
export const DEMO_SIGN_INS: ReadonlyArray<{ email: string; role: 'owner' | 'grower' | 'viewer' }> = [
  { email: 'keeper@example.org', role: 'owner' },
  { email: 'grower@example.org', role: 'grower' },
  { email: 'grower2@example.org', role: 'grower' },
  { email: 'viewer@example.org', role: 'viewer' },
];

export interface DemoAccountsProps {
  onSignedIn: (me: MeResponse) => void;
}

/** "Try the demo circle": one tap signs in as one of the demo members. */
export function DemoAccounts({ onSignedIn }: DemoAccountsProps) {
  const login = useLogin();
  const [pending, setPending] = useState<string>();

  const signInAs = async (email: string) => {
    setPending(email);
    try {
      onSignedIn(await login.mutateAsync({ email, password: DEMO_PASSWORD }));
    } catch {
      // The alert below says what went wrong.
    } finally {
      setPending(undefined);
    }
  };

  return (
    <section
      aria-labelledby="demo-accounts-title"
      className="mt-3 rounded-xl border border-dashed border-seedcoat-300 bg-seedcoat-50 p-4"
    >
      <h2 id="demo-accounts-title" className="text-lg font-bold text-loam-900">
        Try the demo circle
      </h2>
      <p className="mt-0.5 text-sm text-loam-700">
        An invented seed circle with made-up members, lots and tests, on this development server only.
      </p>
      <ul className="mt-3 grid gap-2" aria-label="Demo accounts">
        {DEMO_SIGN_INS.map((account) => (
          <li key={account.email}>
            <Button
              variant="secondary"
              fullWidth
              isLoading={pending === account.email}
              disabled={pending !== undefined && pending !== account.email}
              onClick={() => void signInAs(account.email)}
            >
              <span className="flex min-w-0 flex-1 flex-wrap items-baseline justify-between gap-x-2 text-left">
                <span className="min-w-0 break-all">{account.email}</span>
                <span className="text-sm font-normal text-loam-600">{account.role}</span>
              </span>
            </Button>
          </li>
        ))}
      </ul>
      <p className="mt-2 text-sm text-loam-600">
        Password for all four: <span className="num font-semibold">{DEMO_PASSWORD}</span>
      </p>
      {login.error ? (
        <FormAlert className="mt-2">
          {login.error.message} The demo may not be loaded on this server (npm start loads it on the first
          run).
        </FormAlert>
      ) : null}
    </section>
  );
}
