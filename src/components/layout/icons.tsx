import type { SVGProps } from 'react';

/* Hilum's own line icons, drawn on a 24 px grid with a 2 px stroke. All are decorative. */

function Icon(props: SVGProps<SVGSVGElement>) {
  return (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      stroke="currentColor"
      strokeWidth="2"
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
      className="size-6"
      {...props}
    />
  );
}

/** Sun rising over a furrow: what needs doing now. */
export function OverviewIcon() {
  return (
    <Icon>
      <path d="M7 15a5 5 0 0 1 10 0" />
      <path d="M12 5v2M5.2 8.2l1.4 1.4M18.8 8.2l-1.4 1.4M3 15h1.5M19.5 15H21" />
      <path d="M3 19h18" />
    </Icon>
  );
}

/** A seed packet with its folded flap. */
export function LotsIcon() {
  return (
    <Icon>
      <path d="M6 3h12v18H6z" />
      <path d="M6 7l6 3 6-3" />
      <ellipse cx="12" cy="15" rx="2" ry="2.6" />
    </Icon>
  );
}

export function PlannerIcon() {
  return (
    <Icon>
      <rect x="3.5" y="5" width="17" height="15" rx="2" />
      <path d="M3.5 10h17M8 3v4M16 3v4" />
      <path d="M8 14h2M14 14h2M8 17h2" />
    </Icon>
  );
}

export function MembersIcon() {
  return (
    <Icon>
      <circle cx="9" cy="8.5" r="3" />
      <path d="M3.5 19c.6-3.2 2.8-5 5.5-5s4.9 1.8 5.5 5" />
      <circle cx="16.5" cy="9.5" r="2.5" />
      <path d="M16 14.2c2.3 0 4 1.5 4.5 4.3" />
    </Icon>
  );
}

/** Three sliders: the bank's thresholds and dates. */
export function SettingsIcon() {
  return (
    <Icon>
      <path d="M4 6h9M17 6h3M4 12h3M11 12h9M4 18h11M19 18h1" />
      <circle cx="15" cy="6" r="2" />
      <circle cx="9" cy="12" r="2" />
      <circle cx="17" cy="18" r="2" />
    </Icon>
  );
}

export function AccountIcon() {
  return (
    <Icon>
      <circle cx="12" cy="12" r="9" />
      <circle cx="12" cy="10" r="3" />
      <path d="M6.6 18.2c1.2-2 3.1-3.2 5.4-3.2s4.2 1.2 5.4 3.2" />
    </Icon>
  );
}

export function MailIcon() {
  return (
    <Icon>
      <rect x="3" y="5.5" width="18" height="13" rx="2" />
      <path d="M3.5 7l8.5 6 8.5-6" />
    </Icon>
  );
}

export function ChevronDownIcon() {
  return (
    <Icon className="size-4" strokeWidth="2.5">
      <path d="M6 9l6 6 6-6" />
    </Icon>
  );
}

/** A viewfinder's four corners around a small square: scan a packet's code. */
export function ScanIcon() {
  return (
    <Icon>
      <path d="M4 8V5a1 1 0 0 1 1-1h3M16 4h3a1 1 0 0 1 1 1v3M20 16v3a1 1 0 0 1-1 1h-3M8 20H5a1 1 0 0 1-1-1v-3" />
      <path d="M9 9h6v6H9z" />
    </Icon>
  );
}

/** A tray with an arrow rising out of it, held back by a bar: writes waiting to go. */
export function OutboxIcon() {
  return (
    <Icon>
      <path d="M4 14v5h16v-5" />
      <path d="M12 15V5M8 9l4-4 4 4" />
    </Icon>
  );
}
