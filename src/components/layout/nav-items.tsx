import type { ReactNode } from 'react';
import { paths, type BankArea } from '#src/config/paths';
import { LotsIcon, MembersIcon, OverviewIcon, PlannerIcon, SettingsIcon } from './icons';

export interface NavItem {
  area: BankArea;
  label: string;
  href: string;
  icon: ReactNode;
}

/** The sections of one bank, in the order the navigation lists them. */
export function bankNavItems(bankId: string): NavItem[] {
  return [
    { area: 'overview', label: 'Overview', href: paths.overview.getHref(bankId), icon: <OverviewIcon /> },
    { area: 'lots', label: 'Lots', href: paths.lots.getHref(bankId), icon: <LotsIcon /> },
    { area: 'planner', label: 'Planner', href: paths.planner.getHref(bankId), icon: <PlannerIcon /> },
    { area: 'members', label: 'Members', href: paths.members.getHref(bankId), icon: <MembersIcon /> },
    { area: 'settings', label: 'Settings', href: paths.settings.getHref(bankId), icon: <SettingsIcon /> },
  ];
}
