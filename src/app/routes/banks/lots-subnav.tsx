import { NavLink } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';

/** Tabs inside the Lots area: the lots, the parent plants they were saved from, and seed on offer. */
export function LotsSubnav({ bankId }: { bankId: string }) {
  const tabs = [
    { label: 'Lots', href: paths.lots.getHref(bankId), end: true },
    { label: 'Parent plants', href: paths.plants.getHref(bankId), end: true },
    { label: 'On offer', href: paths.offers.getHref(bankId), end: true },
  ];
  return (
    <nav aria-label="Lots area" className="mb-5 border-b border-loam-200">
      <ul className="-mb-px flex gap-1">
        {tabs.map((tab) => (
          <li key={tab.href}>
            <NavLink
              to={tab.href}
              end={tab.end}
              className={({ isActive }) =>
                cn(
                  'inline-flex min-h-11 items-center border-b-2 px-3 font-semibold',
                  isActive
                    ? 'border-moss-700 text-moss-800'
                    : 'border-transparent text-loam-700 hover:text-loam-950',
                )
              }
            >
              {tab.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
