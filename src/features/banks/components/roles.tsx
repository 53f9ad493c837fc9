import type { Role } from '#shared/schemas/accounts';
import { cn } from '#src/lib/cn';

export const roleOrder: readonly Role[] = ['owner', 'grower', 'viewer'];

export const roleLabels: Record<Role, string> = { owner: 'Owner', grower: 'Grower', viewer: 'Viewer' };

/** What each role may do, in one line (DESIGN.md, "Who uses it, with which role"). */
export const roleSummaries: Record<Role, string> = {
  owner: 'Runs the bank: members, invitations and settings, plus everything a grower does.',
  grower: 'Adds and edits lots, parent plants, photos, tests and counts, and plans sowings.',
  viewer: 'Reads everything in the bank and changes nothing.',
};

const roleLook: Record<Role, string> = {
  owner: 'border-seedcoat-300 bg-seedcoat-100 text-seedcoat-800',
  grower: 'border-moss-300 bg-moss-100 text-moss-800',
  viewer: 'border-frost-200 bg-frost-50 text-frost-800',
};

export function RoleBadge({ role, className }: { role: Role; className?: string }) {
  return (
    <span
      className={cn(
        'inline-flex items-center rounded-full border px-2.5 py-0.5 text-sm font-semibold',
        roleLook[role],
        className,
      )}
    >
      {roleLabels[role]}
    </span>
  );
}
