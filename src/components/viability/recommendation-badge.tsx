import type { ButtonHTMLAttributes, ReactNode } from 'react';
import type { RecommendationValue } from '#shared/schemas/viability';
import { cn } from '#src/lib/cn';
import { recommendationLabels } from './viability-format';

/*
 * Hilum's own marks for the six pieces of advice: palette pills, each with its own small drawing
 * and label, so they read apart without colour too; "test first" also has a dashed edge (nothing
 * measured yet) and "grow out" a solid fill (sow it this year, for seed). Text contrast (WCAG 2.x,
 * from tailwind.config.ts): moss-800 on moss-100 8.5 · seedcoat-800 on seedcoat-100 8.0 · white on
 * moss-700 8.2 · frost-800 on frost-100 8.6 · loam-800 on white 12.5 · clay-800 on clay-100 8.0;
 * the dashed loam-500 edge is 5.0 on white and 4.8 on husk-50 (3:1 needed for a shape's edge).
 */
const looks: Record<RecommendationValue, string> = {
  sow: 'border-moss-300 bg-moss-100 text-moss-800',
  'sow-thick': 'border-seedcoat-300 bg-seedcoat-100 text-seedcoat-800',
  'grow-out': 'border-moss-700 bg-moss-700 text-white',
  retest: 'border-frost-300 bg-frost-100 text-frost-800',
  'test-first': 'border-dashed border-loam-500 bg-white text-loam-800',
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
  // A plant gone to seed, dropping fresh seed.
  'grow-out': (
    <>
      <path d="M7 14.5V6.5" />
      <path d="M7 11.5C7 9.3 5.4 8 2.5 8 2.5 10.2 4.1 11.5 7 11.5Z" fill="currentColor" fillOpacity="0.3" />
      <ellipse cx="7" cy="4" rx="1.8" ry="2.5" fill="currentColor" fillOpacity="0.35" />
      <circle cx="11.5" cy="9" r="1" fill="currentColor" />
      <circle cx="13" cy="12.5" r="1" fill="currentColor" />
    </>
  ),
  // A tray with a count mark: test again.
  retest: (
    <>
      <path d="M2 9h12l-1.5 4h-9Z" fill="currentColor" fillOpacity="0.25" />
      <path d="M5 6.5 7 8.5l4-5" />
    </>
  ),
  // A question: nothing measured yet.
  'test-first': (
    <>
      <path d="M5.5 5.5a2.5 2.5 0 1 1 3.6 2.25C8.4 8.1 8 8.7 8 9.4v.8" />
      <circle cx="8" cy="13" r="0.9" fill="currentColor" stroke="none" />
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

const pill =
  'inline-flex items-center gap-1 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap';

/** The advice as a plain pill. */
export function RecommendationBadge({
  value,
  reason,
  className,
}: {
  value: RecommendationValue;
  reason?: string;
  className?: string;
}) {
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
      className={cn(
        pill,
        looks[value],
        'min-h-8 cursor-pointer hover:brightness-95 active:brightness-90',
        className,
      )}
      {...rest}
    >
      <RecommendationIcon value={value} />
      {recommendationLabels[value]}
      <span className="sr-only">: why?</span>
    </button>
  );
}
