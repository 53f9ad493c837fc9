import { Link } from 'react-router-dom';
import { buttonStyles } from '#src/components/ui/button';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';

export interface PrintLabelLinkProps {
  bankId: string;
  /** The lots to print a label for; one lot on its page, several from a list. */
  lotIds: readonly string[];
  className?: string;
}

/** A link to the printable label sheet for one or more lots. */
export function PrintLabelLink({ bankId, lotIds, className }: PrintLabelLinkProps) {
  const label = lotIds.length === 1 ? 'Print label' : `Print ${lotIds.length} labels`;
  if (lotIds.length === 0) {
    return (
      <span aria-disabled="true" className={cn(buttonStyles({ variant: 'secondary' }), className)}>
        <PrinterIcon />
        Print labels
      </span>
    );
  }
  return (
    <Link
      to={paths.labels.getHref(bankId, lotIds)}
      className={cn(buttonStyles({ variant: 'secondary' }), className)}
    >
      <PrinterIcon />
      {label}
    </Link>
  );
}

/** A printer with a label coming out of it (decorative). */
export function PrinterIcon() {
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
      className="size-5 shrink-0"
    >
      <path d="M7 8V3h10v5" />
      <rect x="3" y="8" width="18" height="8" rx="2" />
      <path d="M7 13h10v8H7z" />
      <path d="M10 17h4" />
    </svg>
  );
}
