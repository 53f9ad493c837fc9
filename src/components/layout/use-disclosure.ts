import { useEffect, useRef, useState } from 'react';
import { useLocation } from 'react-router-dom';

/**
 * A button that shows and hides a panel (a disclosure, not an ARIA menu), closed by Escape, a
 * click outside or moving to another page.
 */
export function useDisclosure() {
  const location = useLocation();
  const here = location.pathname + location.search;
  // Remember where the panel was opened: moving to another page closes it without an effect.
  const [openedAt, setOpenedAt] = useState<string | null>(null);
  const open = openedAt === here;
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

  return {
    open,
    setOpen: (value: boolean) => setOpenedAt(value ? here : null),
    rootRef,
    buttonRef,
  };
}
