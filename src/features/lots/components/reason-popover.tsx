import { useEffect, useLayoutEffect, useRef } from 'react';
import type { RankingItem } from '#shared/schemas/viability';
import { RecommendationBadge } from '#src/components/viability/recommendation-badge';

export interface OpenReason {
  item: RankingItem;
  /** The pressed badge's box on screen, to place the reason under it. */
  anchor: DOMRect;
}

const WIDTH = 320;

/**
 * The reason for a lot's advice, in the browser's top layer (a native popover), so the table's
 * scroll box does not clip it. Escape or a press elsewhere closes it.
 */
export function ReasonPopover({ open, onClose }: { open: OpenReason | null; onClose: () => void }) {
  const ref = useRef<HTMLDivElement>(null);

  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    if (open && !el.matches(':popover-open')) el.showPopover();
    if (!open && el.matches(':popover-open')) el.hidePopover();
  }, [open]);

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const onToggle = (event: Event) => {
      if ((event as ToggleEvent).newState === 'closed') onClose();
    };
    el.addEventListener('toggle', onToggle);
    return () => el.removeEventListener('toggle', onToggle);
  }, [onClose]);

  const left = open ? Math.max(8, Math.min(open.anchor.right - WIDTH, window.innerWidth - WIDTH - 8)) : 0;
  const below = open ? open.anchor.bottom + 6 : 0;
  const flip = open ? below + 140 > window.innerHeight : false;

  return (
    <div
      ref={ref}
      popover="auto"
      role="dialog"
      aria-label={open ? `Why ${open.item.code} is advised so` : 'Reason'}
      className="m-0 rounded-xl border border-loam-300 bg-white p-3 text-left text-sm text-loam-900 shadow-lg shadow-loam-900/15"
      style={{
        position: 'fixed',
        width: WIDTH,
        inset: 'auto',
        left,
        ...(flip && open ? { bottom: window.innerHeight - open.anchor.top + 6 } : { top: below }),
      }}
    >
      {open ? (
        <>
          <p className="flex items-center justify-between gap-2 font-bold">
            <span>{open.item.code}</span>
            <RecommendationBadge value={open.item.recommendation} />
          </p>
          <p className="mt-1.5 text-loam-800">{open.item.reason}</p>
        </>
      ) : null}
    </div>
  );
}
