import type { ReactNode } from 'react';
import { cn } from '#src/lib/cn';

export type FormAlertTone = 'error' | 'info' | 'success';

const tones: Record<FormAlertTone, string> = {
  error: 'border-clay-300 bg-clay-100 text-clay-800',
  info: 'border-frost-200 bg-frost-50 text-frost-800',
  success: 'border-moss-200 bg-moss-100 text-moss-800',
};

export interface FormAlertProps {
  children?: ReactNode;
  tone?: FormAlertTone;
  title?: ReactNode;
  className?: string;
}

/**
 * A message about a whole form or section (a failed sign-in, a refused change). Errors are
 * announced at once (role="alert"); other tones politely (role="status"). Renders nothing when empty.
 */
export function FormAlert({ children, tone = 'error', title, className }: FormAlertProps) {
  if (children === undefined || children === null || children === false || children === '') return null;
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      className={cn('rounded-lg border px-3 py-2.5 text-base', tones[tone], className)}
    >
      {title !== undefined ? <p className="font-bold">{title}</p> : null}
      <div className={cn(title === undefined && 'font-semibold')}>{children}</div>
    </div>
  );
}
