/** Which 95% interval the server computes: Wilson score (its default) or exact Clopper–Pearson. */
export type IntervalMethod = 'wilson' | 'clopper-pearson';
