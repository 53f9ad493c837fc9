import { useState } from 'react';
import { Outlet, useLocation } from 'react-router-dom';
import { FormAlert } from '#src/components/ui/form-alert';

/** Location state a page can pass when it opens a bank ("Welcome to …"). */
export interface BankNoticeState {
  notice?: string;
}

/** Around every page of one bank: a one-time notice from the page that led here. */
export function BankLayout() {
  const location = useLocation();
  const notice = (location.state as BankNoticeState | null)?.notice;
  const [dismissedKey, setDismissedKey] = useState<string | null>(null);
  const show = notice !== undefined && dismissedKey !== location.key;

  return (
    <>
      {show ? (
        <div className="mb-5 flex items-start gap-3">
          <FormAlert tone="success" className="flex-1">
            {notice}
          </FormAlert>
          <button
            type="button"
            onClick={() => setDismissedKey(location.key)}
            className="min-h-11 rounded-lg px-3 font-semibold text-loam-700 hover:bg-husk-200"
          >
            Dismiss
          </button>
        </div>
      ) : null}
      <Outlet />
    </>
  );
}
