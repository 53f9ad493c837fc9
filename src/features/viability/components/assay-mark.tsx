/*
 * The marks of a lot's tests in the decline chart and in its key, kept apart from the chart so the
 * key does not load the chart library. Palette values from tailwind.config.ts.
 */
export const DOT = '#77491f'; // seedcoat-700
export const ASIDE = '#7d6d59'; // loam-500

/** How a test stands in the decline: in the model, read as held back, or set aside by the grower. */
export type AssayKind = 'model' | 'held-back' | 'set-aside';

/** A filled dot for a test in the model, a hollow diamond for one held back, a cross for one set aside. */
export function AssayMark({ kind, cx, cy }: { kind: AssayKind; cx: number; cy: number }) {
  if (kind === 'held-back') {
    return (
      <path
        d={`M${cx},${cy - 6.5}L${cx + 6.5},${cy}L${cx},${cy + 6.5}L${cx - 6.5},${cy}Z`}
        fill="#ffffff"
        stroke={DOT}
        strokeWidth={2.25}
      />
    );
  }
  if (kind === 'set-aside') {
    return (
      <path
        d={`M${cx - 5},${cy - 5}L${cx + 5},${cy + 5}M${cx + 5},${cy - 5}L${cx - 5},${cy + 5}`}
        stroke={ASIDE}
        strokeWidth={2.5}
        strokeLinecap="round"
        fill="none"
      />
    );
  }
  return <circle cx={cx} cy={cy} r={5} fill={DOT} />;
}
