import { useEffect, useId, useRef, useState } from 'react';
import { useLocation } from 'react-router-dom';
import { cn } from '../../lib/cn';
import { AccountIcon, ChevronDownIcon } from './icons';

/**
 * Placeholder for the signed-in person's menu (name, banks, sign out). It is a disclosure, not an
 * ARIA menu: a button that shows and hides a panel, closed by Escape, a click outside or navigation.
 */
export function AccountMenu() {
  const location = useLocation();
  const here = location.pathname + location.search;
  // Remember where the panel was opened: moving to another page closes it without an effect.
  const [openedAt, setOpenedAt] = useState<string | null>(null);
  const open = openedAt === here;
  const setOpen = (value: boolean) => setOpenedAt(value ? here : null);
  const panelId = useId();
  const rootRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!open) return;
    function onPointerDown(event: PointerEvent) {
      if (rootRef.current && !rootRef.current.contains(event.target as Node)) setOpenedAt(null);
    }
    function onKeyDown(event: KeyboardEvent) {
      if (event.key === 'Escape') {
        setOpenedAt(null);
        buttonRef.current?.focus();
      }
    }
    document.addEventListener('pointerdown', onPointerDown);
    document.addEventListener('keydown', onKeyDown);
    return () => {
      document.removeEventListener('pointerdown', onPointerDown);
      document.removeEventListener('keydown', onKeyDown);
    };
  }, [open]);

  return (
    <div ref={rootRef} className="relative">
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen(!open)}
        className={cn(
          'inline-flex min-h-11 min-w-11 items-center justify-center gap-1 rounded-lg px-2 text-loam-800',
          'hover:bg-husk-200 active:bg-husk-300',
          open && 'bg-husk-200',
        )}
      >
        <AccountIcon />
        <span className="sr-only sm:not-sr-only sm:font-semibold">Account</span>
        <ChevronDownIcon />
      </button>
      <div
        id={panelId}
        hidden={!open}
        className="absolute right-0 z-30 mt-2 w-64 rounded-xl border border-loam-200 bg-white p-4 shadow-lg shadow-loam-900/10"
      >
        <p className="font-semibold text-loam-900">Not signed in</p>
        <p className="mt-1 text-sm text-loam-600">
          Signing in, your banks and signing out will live here once accounts arrive.
        </p>
      </div>
    </div>
  );
}
