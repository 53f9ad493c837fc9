import { useCallback } from 'react';
import { useSearchParams } from 'react-router-dom';
import { defaultSowingDate, parseSowingDate } from '#src/lib/sowing-date';

/**
 * The sowing date a page projects to: `?on=` from the address (so a link keeps it), else the
 * coming sowing date from the bank's frost date. Setting the default again drops it from the address.
 */
export function useSowingDate(lastFrost: string | null, today: string) {
  const [search, setSearch] = useSearchParams();
  const defaultOn = defaultSowingDate(lastFrost, today);
  const chosen = parseSowingDate(search.get('on'));
  const setOn = useCallback(
    (value: string | undefined) =>
      setSearch(
        (current) => {
          const next = new URLSearchParams(current);
          if (value && value !== defaultOn) next.set('on', value);
          else next.delete('on');
          return next;
        },
        { replace: true, preventScrollReset: true },
      ),
    [setSearch, defaultOn],
  );
  return { on: chosen ?? defaultOn, defaultOn, isDefault: chosen === undefined, setOn };
}
