import type { ReactNode } from 'react';
import { paths, type BankArea } from '../../config/paths';
import { LotsIcon, MembersIcon, OverviewIcon, PlannerIcon, SettingsIcon } from './icons';

export interface NavItem {
  area: BankArea;
  label: string;
  href: string;
  icon: ReactNode;
}

export const navItems: readonly NavItem[] = [
  { area: 'overview', label: 'Overview', href: paths.overview.getHref(), icon: <OverviewIcon /> },
  { area: 'lots', label: 'Lots', href: paths.lots.getHref(), icon: <LotsIcon /> },
  { area: 'planner', label: 'Planner', href: paths.planner.getHref(), icon: <PlannerIcon /> },
  { area: 'members', label: 'Members', href: paths.members.getHref(), icon: <MembersIcon /> },
  { area: 'settings', label: 'Settings', href: paths.settings.getHref(), icon: <SettingsIcon /> },
];
