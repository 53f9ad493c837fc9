import type { ButtonHTMLAttributes, ReactNode } from 'react';
import type { RecommendationValue } from '../../../../shared/schemas/viability';
import { cn } from '../../../lib/cn';
import { recommendationLabels } from './viability-format';

/*
 * Hilum's own marks for the four pieces of advice: palette pills, each with its own small drawing,
 * so they read apart without colour too.
 */
const looks: Record<RecommendationValue, string> = {
  sow: 'border-moss-300 bg-moss-100 text-moss-800',
  'sow-thick': 'border-seedcoat-300 bg-seedcoat-100 text-seedcoat-800',
  retest: 'border-frost-300 bg-frost-100 text-frost-800',
  retire: 'border-clay-300 bg-clay-100 text-clay-800',
};

const icons: Record<RecommendationValue, ReactNode> = {
  // A seed with one shoot.
  sow: (
    <>
      <path d="M8 14.5V7" />
      <path d="M8 10C8 7.2 6.2 5.5 3 5.5 3 8.3 4.8 10 8 10Z" fill="currentColor" fillOpacity="0.3" />
      <path d="M8 8C8 5.2 9.8 3.5 13 3.5 13 6.3 11.2 8 8 8Z" fill="currentColor" fillOpacity="0.3" />
    </>
  ),
  // Three seeds close together.
  'sow-thick': (
    <>
      <ellipse cx="5" cy="10" rx="2.2" ry="3" fill="currentColor" fillOpacity="0.25" />
      <ellipse cx="11" cy="10" rx="2.2" ry="3" fill="currentColor" fillOpacity="0.25" />
      <ellipse cx="8" cy="5" rx="2.2" ry="3" fill="currentColor" fillOpacity="0.25" />
    </>
  ),
  // A tray with a count mark: test again.
  retest: (
    <>
      <path d="M2 9h12l-1.5 4h-9Z" fill="currentColor" fillOpacity="0.25" />
      <path d="M5 6.5 7 8.5l4-5" />
    </>
  ),
  // A packet put away.
  retire: (
    <>
      <rect x="3" y="3" width="10" height="10" rx="1.5" fill="currentColor" fillOpacity="0.2" />
      <path d="M5.5 8h5" />
    </>
  ),
};

export function RecommendationIcon({ value, className }: { value: RecommendationValue; className?: string }) {
  return (
    <svg
      viewBox="0 0 16 16"
      aria-hidden="true"
      className={cn('size-4 shrink-0', className)}
      fill="none"
      stroke="currentColor"
      strokeWidth="1.6"
      strokeLinecap="round"
      strokeLinejoin="round"
    >
      {icons[value]}
    </svg>
  );
}

const pill = 'inline-flex items-center gap-1 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap';

/** The advice as a plain pill. */
export function RecommendationBadge({ value, reason, className }: { value: RecommendationValue; reason?: string; className?: string }) {
  return (
    <span title={reason} className={cn(pill, looks[value], className)}>
      <RecommendationIcon value={value} />
      {recommendationLabels[value]}
    </span>
  );
}

/** The advice as a pill that opens its reason when pressed (the reason is its hover title too). */
export function RecommendationButton({
  value,
  reason,
  className,
  ...rest
}: { value: RecommendationValue; reason: string } & Omit<ButtonHTMLAttributes<HTMLButtonElement>, 'value'>) {
  return (
    <button
      type="button"
      title={reason}
      className={cn(pill, looks[value], 'min-h-8 cursor-pointer hover:brightness-95 active:brightness-90', className)}
      {...rest}
    >
      <RecommendationIcon value={value} />
      {recommendationLabels[value]}
      <span className="sr-only">: why?</span>
    </button>
  );
}
