import { useId } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';
import { ChevronDownIcon } from './icons';
import { useDisclosure } from './use-disclosure';

export interface SwitcherBank {
  bankId: string;
  bankName: string;
}

export interface BankSwitcherProps {
  banks: readonly SwitcherBank[];
  currentBankId: string | undefined;
}

/** The bank in view, the person's other banks, and a way to start one more. */
export function BankSwitcher({ banks, currentBankId }: BankSwitcherProps) {
  const { open, setOpen, rootRef, buttonRef } = useDisclosure();
  const panelId = useId();
  const current = banks.find((bank) => bank.bankId === currentBankId);
  const others = banks.filter((bank) => bank.bankId !== currentBankId);

  return (
    <div ref={rootRef} className="relative min-w-0">
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen(!open)}
        className={cn(
          'inline-flex min-h-11 max-w-full items-center gap-1 rounded-lg border border-husk-300 bg-husk-50 px-2.5 text-left',
          'hover:bg-husk-200 active:bg-husk-300',
          open && 'bg-husk-200',
        )}
      >
        <span className="sr-only">Bank: </span>
        <span className="truncate font-semibold text-loam-900">{current?.bankName ?? 'Your banks'}</span>
        <ChevronDownIcon />
      </button>
      <div
        id={panelId}
        hidden={!open}
        className="absolute left-0 z-30 mt-2 w-72 max-w-[calc(100vw-1.5rem)] rounded-xl border border-loam-200 bg-white p-2 shadow-lg shadow-loam-900/10"
      >
        {current ? (
          <p className="px-2 pb-2 pt-1 text-sm text-loam-600">
            You are in <span className="font-semibold text-loam-900">{current.bankName}</span>
          </p>
        ) : null}
        {others.length > 0 ? (
          <>
            <p className="px-2 pt-1 text-xs font-semibold uppercase tracking-wide text-seedcoat-700">
              {current ? 'Your other banks' : 'Your banks'}
            </p>
            <ul>
              {others.map((bank) => (
                <li key={bank.bankId}>
                  <Link
                    to={paths.overview.getHref(bank.bankId)}
                    className="flex min-h-11 items-center rounded-lg px-2 font-semibold text-loam-900 hover:bg-husk-100"
                  >
                    {bank.bankName}
                  </Link>
                </li>
              ))}
            </ul>
          </>
        ) : null}
        <div className={cn(others.length > 0 || current ? 'mt-1 border-t border-loam-100 pt-1' : '')}>
          <Link
            to={paths.newBank.getHref()}
            className="flex min-h-11 items-center gap-2 rounded-lg px-2 font-semibold text-moss-800 hover:bg-moss-50"
          >
            <span aria-hidden="true" className="text-xl leading-none">
              +
            </span>
            Start a new bank
          </Link>
        </div>
      </div>
    </div>
  );
}
