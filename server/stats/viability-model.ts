/**
 * The viability decline of a species' lots, fitted together: a hierarchical form of the seed
 * viability equation (Ellis & Roberts 1980, Ann. Bot. 45:13–30), v = Kᵢ − b·p, with v and Kᵢ in
 * probits and p the storage time. Ages here are *equivalent* ages: years at the species' reference
 * storage (the caller scales calendar age by storage temperature, storage-sigma.ts), so a room lot
 * and a freezer lot of one species share one rate of decline per equivalent year.
 *
 * The model, for lot j with tests i:
 *   germinated_ij ~ Binomial(sown_ij, Φ(K_j − b_j·age_ij))
 *   K_j ~ Normal(μ_K, s_K²), truncated to [K_MIN, K_MAX]  (initial viability; seed cannot start
 *        above 99.9%, so back-extrapolation is bounded)
 *   log b_j ~ Normal(μ_s, τ²)                              (the lot's own rate around its species')
 *   μ_s ~ Normal(log b₀, ω²)                               (b₀ from the species' typical seed life)
 * and it is fitted exactly on grids (no iterative optimiser, so nothing fails to converge):
 * μ_s on a grid, each lot's K integrated numerically around its conditional mode for each rate.
 * Each lot borrows from its species through μ_s, computed without that lot's own tests (so a lot
 * does not count its evidence twice), and a lot whose likelihood cannot be evaluated is left out
 * of its species and reported, never changing another lot's result.
 *
 * A test that a later test beats by far more than chance (one-sided two-proportion z > Z_HELD_BACK)
 * is read as held back (dormancy, or conditions), and enters only as "at least this many were
 * alive": a result that rises with age is not read as decline.
 *
 * Evidence weaker than a counted test enters through its own likelihood in place of the binomial:
 * a tray sown by weight or guess through the binomial averaged over the number truly sown (a
 * log-normal with the estimate's mean and SD, cut below at the seedlings counted: at least that
 * many were sown); a roughly scored tray as the chance of its score band
 * (rough-evidence.ts, roughScoreLikelihood); seedlings that came up from a real sowing as field
 * emergence, averaged over the establishment share FIELD_ESTABLISHMENT (emergenceLogLikelihood).
 * Only counted tests take part in the held-back comparison.
 */
import { normalCdf, normalQuantile } from './distributions';
import {
  emergenceLogLikelihood,
  roughScoreLikelihood,
  type Emergence,
  type RoughScore,
} from './rough-evidence';
import { gammaln } from 'simple-statistics';
import { regularizedBeta } from './special-functions';

export interface ModelAssay {
  id: string;
  /** Equivalent years at the species' reference storage. */
  age: number;
  /**
   * Seeds alive at the test: normal seedlings, plus fresh (dormant) seeds when recorded. Need not be
   * whole (an effective trial). Unused when `evidence` is a score.
   */
  alive: number;
  /** Seeds sown (expected, for an estimated tray or a sowing); need not be whole. */
  sown: number;
  /** Absent for a counted test (binomial). Otherwise how this weaker evidence enters the model. */
  evidence?: ModelEvidence;
}

export type ModelEvidence =
  /**
   * A tray whose seeds sown were estimated (by weight or a guess): `sown` is the estimate's mean,
   * `sownSd` the SD of the true number around it, `alive` the seedlings counted.
   */
  | { kind: 'estimated'; sownSd: number }
  /** A test tray scored roughly instead of counted. */
  | { kind: 'score'; score: RoughScore }
  /** What came up from a real sowing (field emergence): seedlings counted or a rough score. */
  | { kind: 'emergence'; emergence: Emergence };

export interface ModelLot {
  id: string;
  assays: readonly ModelAssay[];
}

export interface SpeciesPrior {
  /**
   * Typical seed life in years at the reference storage, read as the age at which a lot starting at
   * TYPICAL_INITIAL falls to 50% (our reading of handbook "seed life" figures); null when unknown.
   */
  typicalLifeYears: number | null;
}

/** Hyperparameters: each an assumption, documented in docs/viability-model.md. */
export const MODEL_CONSTANTS = {
  /** Mean initial viability, probits: Φ⁻¹(0.90); home-saved and bought seed usually starts 80–98%. */
  muK: normalQuantile(0.9),
  /** Spread of initial viability between lots, probits (95% of lots between about 45% and 99.7%). */
  sK: 0.75,
  /** Bounds of initial viability, probits: Φ(−1.5) ≈ 7% to Φ(3.09) ≈ 99.9%. */
  kMin: -1.5,
  kMax: normalQuantile(0.999),
  /** Handbook seed-life figures read as 85% → 50% (FAO 2014 4.3.2 asks > 85% initial). */
  typicalInitial: 0.85,
  /** log-scale spread of the species rate around the handbook figure: a factor of 3 either way at 95%. */
  omega: Math.log(3) / 1.96,
  /** Without a handbook figure: a 3-year life with a factor of 10 either way at 95%. */
  unknownLifeYears: 3,
  omegaUnknown: Math.log(10) / 1.96,
  /** log-scale spread of a lot's rate around its species': a factor of 2 either way at 95%. */
  tau: Math.log(2) / 1.96,
  /** A later test beating an earlier one by more than this one-sided z reads the earlier as held back. */
  zHeldBack: 3,
} as const;

const MU_GRID = 61;
const RATE_GRID = 33;
const K_GRID = 17;
/** Coarse nodes this close to the mode's log density (a factor e¹² ≈ 160,000) are inside the grid. */
const PLATEAU_LOG = 12;
const K_SCAN = 13;
/** The most K nodes when a flat side widens the grid (half a coarse step apart over the whole range). */
const K_GRID_MAX = 2 * (K_SCAN - 1) + 1;
/** Posterior draws kept per lot (systematic resampling of the grid), enough for 2.5% tails. */
const DRAWS = 400;

export interface Band {
  percent: number;
  low: number;
  high: number;
}

/** A weighted draw of a lot's posterior: initial viability K (probits) and rate b (probits a year). */
interface Point {
  k: number;
  b: number;
  w: number;
}

export interface LotModel {
  lotId: string;
  /** How the rate is known: the lot's own tests at two or more ages ('lot'), its species' other lots ('species'), or the handbook figure alone ('typical'). */
  basis: 'lot' | 'species' | 'typical';
  /** No usable test of the lot: everything below is the species' estimate for such a lot. */
  estimateOnly: boolean;
  initial: Band;
  /** Posterior median rate, probits per equivalent year, and σ = 1/b. */
  rate: number;
  sigmaYears: number;
  /** Posterior median of the equivalent age at 50% viability (K/b; 0 when the lot started below 50%). */
  halfLifeYears: number;
  /** Test ids read as held back (dormancy or conditions): they enter only as a lower bound. */
  heldBack: string[];
  notes: string[];
  points: Point[];
}

export type LotModelResult = { ok: true; model: LotModel } | { ok: false; lotId: string; reason: string };

const LOG_EPS = 1e-300;

/**
 * log Φ(x) from a table of the exact Φ (distributions.ts) at steps of 1/1024 over [−38, 9],
 * interpolated linearly: the fits evaluate Φ millions of times, and the exact function is slow.
 * log Φ is smooth (|d²/dx²| ≤ 1), so the error is below 2e-7 in the log, i.e. a relative error
 * below 2e-7 in Φ and in 1 − Φ alike, far into both tails.
 */
const TABLE_FROM = -38;
const TABLE_TO = 9;
const TABLE_STEP = 1 / 1024;
let logPhiTable: Float64Array | null = null;
export function logPhi(x: number): number {
  if (x > TABLE_TO) return -Math.exp(logPhi(-x)); // log(1 − ε) ≈ −ε
  if (x < TABLE_FROM) return -0.5 * x * x - Math.log(-x) - 0.5 * Math.log(2 * Math.PI); // Mills ratio
  if (!logPhiTable) {
    const n = Math.round((TABLE_TO - TABLE_FROM) / TABLE_STEP) + 1;
    logPhiTable = new Float64Array(n);
    for (let i = 0; i < n; i++) logPhiTable[i] = Math.log(normalCdf(TABLE_FROM + i * TABLE_STEP));
  }
  const u = (x - TABLE_FROM) / TABLE_STEP;
  const i = Math.min(Math.floor(u), logPhiTable.length - 2);
  const f = u - i;
  return logPhiTable[i]! * (1 - f) + logPhiTable[i + 1]! * f;
}
const phi = (x: number) => Math.exp(logPhi(x));

function logBinomialKernel(alive: number, sown: number, x: number): number {
  return (alive > 0 ? alive * logPhi(x) : 0) + (sown > alive ? (sown - alive) * logPhi(-x) : 0);
}

/** log P(X ≥ alive), X ~ Binomial(sown, p): a held-back test says at least this many were alive. */
function logAtLeast(alive: number, sown: number, p: number): number {
  if (alive <= 0) return 0;
  const q = Math.min(1 - 1e-15, Math.max(1e-15, p));
  return Math.log(Math.max(LOG_EPS, regularizedBeta(q, alive, sown - alive + 1)));
}

function heldBackAssays(all: readonly ModelAssay[]): Set<string> {
  const out = new Set<string>();
  const assays = all.filter((t) => !t.evidence);
  for (const a of assays) {
    for (const b of assays) {
      if (b.age <= a.age) continue;
      const pa = a.alive / a.sown;
      const pb = b.alive / b.sown;
      const pooled = (a.alive + b.alive) / (a.sown + b.sown);
      const se = Math.sqrt(pooled * (1 - pooled) * (1 / a.sown + 1 / b.sown));
      if (se > 0 && (pb - pa) / se > MODEL_CONSTANTS.zHeldBack) out.add(a.id);
    }
  }
  return out;
}

function logLik(assays: readonly ModelAssay[], heldBack: Set<string>, k: number, b: number): number {
  let sum = 0;
  for (const t of assays) {
    const x = k - b * t.age;
    if (t.evidence) {
      sum += weakLogLik(t as ModelAssay & { evidence: ModelEvidence }, x);
      continue;
    }
    sum +=
      heldBack.size > 0 && heldBack.has(t.id)
        ? logAtLeast(t.alive, t.sown, phi(x))
        : logBinomialKernel(t.alive, t.sown, x);
  }
  return sum;
}

function weakLogLik(t: ModelAssay & { evidence: ModelEvidence }, x: number): number {
  const evidence = t.evidence;
  if (evidence.kind === 'estimated') return estimatedLogLik(t, evidence.sownSd, x);
  const q = Math.min(1, Math.max(0, phi(x)));
  const v =
    evidence.kind === 'score'
      ? Math.log(roughScoreLikelihood(evidence.score, q, t.sown))
      : emergenceLogLikelihood(evidence.emergence, t.sown, q);
  return Math.max(Math.log(LOG_EPS), v);
}

/**
 * Nodes of the number truly sown: the log-normal's z on an even grid out to 5 SD (its upper tail
 * carries the large trays that pull a germination estimate up, so quantile midpoints, which stop
 * near 2 SD, undercover), cut below at the seedlings counted, trapezoid weights φ(z)·Δz.
 */
const SOWN_NODES = 48;
const SOWN_Z_MAX = 5;
const sownNodesCache = new WeakMap<ModelAssay, { n: Float64Array; logW: Float64Array }>();

function sownNodes(t: ModelAssay, sd: number) {
  const cached = sownNodesCache.get(t);
  if (cached) return cached;
  const seedlings = t.alive;
  const s2 = Math.log1p((sd / t.sown) ** 2);
  const m = Math.log(t.sown) - s2 / 2;
  const s = Math.sqrt(s2);
  // At least the seedlings were sown: the log-normal cut below at max(seedlings, 1).
  const floor = Math.max(seedlings, 1);
  const n = new Float64Array(SOWN_NODES);
  const logW = new Float64Array(SOWN_NODES);
  const zFrom = s > 0 ? Math.max(-SOWN_Z_MAX, (Math.log(floor) - m) / s) : 0;
  const count = s > 0 && zFrom < SOWN_Z_MAX ? SOWN_NODES : 1;
  const dz = count > 1 ? (SOWN_Z_MAX - zFrom) / (count - 1) : 1;
  for (let i = 0; i < SOWN_NODES; i++) {
    if (i >= count) {
      logW[i] = Number.NEGATIVE_INFINITY;
      n[i] = floor;
      continue;
    }
    const z = zFrom + i * dz;
    n[i] = count > 1 ? Math.max(floor, Math.exp(m + s * z)) : Math.max(floor, t.sown);
    const end = i === 0 || i === count - 1 ? 0.5 : 1;
    logW[i] =
      (count > 1 ? -0.5 * z * z + Math.log(end * dz) : 0) +
      gammaln(n[i]! + 1) -
      gammaln(seedlings + 1) -
      gammaln(n[i]! - seedlings + 1);
  }
  const nodes = { n, logW };
  sownNodesCache.set(t, nodes);
  return nodes;
}

/** log Σᵢ wᵢ · C(Nᵢ, x) pˣ (1 − p)^(Nᵢ − x) over the nodes Nᵢ of the number truly sown (up to a constant). */
function estimatedLogLik(t: ModelAssay, sownSd: number, x: number): number {
  const { n, logW } = sownNodes(t, sownSd);
  const lp = logPhi(x);
  const lq = logPhi(-x);
  const y = t.alive;
  let top = Number.NEGATIVE_INFINITY;
  const terms = new Float64Array(SOWN_NODES);
  for (let i = 0; i < SOWN_NODES; i++) {
    const v = logW[i]! + (y > 0 ? y * lp : 0) + (n[i]! > y ? (n[i]! - y) * lq : 0);
    terms[i] = v;
    if (v > top) top = v;
  }
  if (!Number.isFinite(top)) return Math.log(LOG_EPS);
  let sum = 0;
  for (let i = 0; i < SOWN_NODES; i++) sum += Math.exp(terms[i]! - top);
  return Math.max(Math.log(LOG_EPS), top + Math.log(sum));
}

/** Why a piece of evidence cannot be read, or null when it can. */
function unreadable(t: ModelAssay): string | null {
  if (!Number.isFinite(t.age) || t.age < 0 || !(t.sown > 0)) return 'none sown, or no age';
  if (!t.evidence) return t.alive >= 0 && t.alive <= t.sown ? null : 'more alive than sown';
  if (t.evidence.kind === 'estimated') {
    const sd = t.evidence.sownSd;
    return Number.isInteger(t.alive) && t.alive >= 0 && Number.isFinite(sd) && sd >= 0
      ? null
      : 'seedlings not a whole number, or no spread of the number sown';
  }
  if (t.evidence.kind === 'emergence' && 'seedlings' in t.evidence.emergence) {
    const y = t.evidence.emergence.seedlings;
    return Number.isInteger(y) && y >= 0 ? null : 'seedlings not a whole number';
  }
  return null;
}

const logNormalPdf = (x: number, mean: number, sd: number) => -0.5 * ((x - mean) / sd) ** 2 - Math.log(sd);

function linspace(from: number, to: number, n: number): number[] {
  return Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1));
}

function logSumExp(xs: readonly number[]): number {
  let max = Number.NEGATIVE_INFINITY;
  for (const x of xs) if (x > max) max = x;
  if (!Number.isFinite(max)) return max;
  let s = 0;
  for (const x of xs) s += Math.exp(x - max);
  return max + Math.log(s);
}

/**
 * For a fixed rate b: the K grid (around the conditional mode) and the log of prior × likelihood at
 * each node, plus the log of their integral over K.
 */
function conditionalK(assays: readonly ModelAssay[], heldBack: Set<string>, b: number) {
  const { muK, sK, kMin, kMax } = MODEL_CONSTANTS;
  const f = (k: number) => logNormalPdf(k, muK, sK) + logLik(assays, heldBack, k, b);
  // A coarse scan finds the mode's neighbourhood; the fine grid spans it generously.
  const coarse = linspace(kMin, kMax, K_SCAN);
  const values = coarse.map(f);
  let bestIndex = 0;
  values.forEach((v, i) => {
    if (v > values[bestIndex]!) bestIndex = i;
  });
  const best = coarse[bestIndex]!;
  const bestValue = values[bestIndex]!;
  const step = (kMax - kMin) / (K_SCAN - 1);
  // Curvature at the mode sets the fine grid's width (at least one coarse step either side).
  const h = 1e-3;
  const curvature = -(f(best + h) - 2 * bestValue + f(best - h)) / (h * h);
  const sd = curvature > 0 && Number.isFinite(curvature) ? 1 / Math.sqrt(curvature) : step;
  const half = Math.max(step * 1.5, 6 * sd);
  let lo = Math.max(kMin, best - half);
  let hi = Math.min(kMax, best + half);
  // A likelihood with a long flat side (a tray whose seeds sown were estimated may have been all
  // germinating) is not bounded by its curvature: the grid also spans every coarse node within
  // PLATEAU_LOG of the mode, so that side's mass is not cut off.
  values.forEach((v, i) => {
    if (v < bestValue - PLATEAU_LOG) return;
    lo = Math.min(lo, Math.max(kMin, coarse[i]! - step));
    hi = Math.max(hi, Math.min(kMax, coarse[i]! + step));
  });
  const points = Math.min(K_GRID_MAX, Math.max(K_GRID, Math.ceil((hi - lo) / (step / 2)) + 1));
  const ks = linspace(lo, hi, points);
  const dk = (hi - lo) / (points - 1);
  const logs = ks.map((k, i) => f(k) + Math.log(dk * (i === 0 || i === points - 1 ? 0.5 : 1)));
  return { ks, logs, logMarginal: logSumExp(logs) };
}

interface SpeciesGrid {
  mus: number[];
  /** Per lot with tests: log ∫ prior(K) L_j(K, b) dK at each rate of the grid. */
  marginals: Map<string, number[]>;
  logPrior: number[];
  /** Per lot with tests: log ∫ L_j(b) N(log b; μ, τ²) d log b at each μ. */
  contributions: Map<string, number[]>;
  rates: number[];
}

function speciesPriorMean(prior: SpeciesPrior): { mean: number; sd: number } {
  const c = MODEL_CONSTANTS;
  const drop = normalQuantile(c.typicalInitial); // probits from 85% to 50%
  const life = prior.typicalLifeYears ?? c.unknownLifeYears;
  return { mean: Math.log(drop / life), sd: prior.typicalLifeYears ? c.omega : c.omegaUnknown };
}

/** Fits every lot of one species together. Lots without usable tests get the species' estimate. */
export function fitSpeciesModel(lots: readonly ModelLot[], prior: SpeciesPrior): LotModelResult[] {
  const c = MODEL_CONSTANTS;
  const { mean: m0, sd: omega } = speciesPriorMean(prior);
  const spread = Math.sqrt(omega * omega + c.tau * c.tau);
  const mus = linspace(m0 - 4.5 * omega, m0 + 4.5 * omega, MU_GRID);
  const logRates = linspace(m0 - 4.5 * spread - 1, m0 + 4.5 * spread + 1, RATE_GRID);
  const dLogRate = logRates[1]! - logRates[0]!;

  const failures = new Map<string, string>();
  const heldBackByLot = new Map<string, Set<string>>();
  // Each lot's marginal likelihood of its rate, on the shared log-rate grid.
  const marginals = new Map<string, number[]>();
  for (const lot of lots) {
    if (lot.assays.length === 0) continue;
    const bad = lot.assays.find((t) => unreadable(t) !== null);
    if (bad) {
      failures.set(
        lot.id,
        'One of its tests has counts that cannot be read (more alive than sown, or none sown).',
      );
      continue;
    }
    const held = heldBackAssays(lot.assays);
    heldBackByLot.set(lot.id, held);
    const m = logRates.map((lr) => conditionalK(lot.assays, held, Math.exp(lr)).logMarginal);
    if (m.some((v) => Number.isNaN(v)) || !m.some((v) => Number.isFinite(v))) {
      failures.set(lot.id, 'Its tests could not be fitted together.');
      continue;
    }
    marginals.set(lot.id, m);
  }

  // Each lot's factor in the species posterior: ∫ L_j(b) N(log b; μ, τ²) for every μ on the grid.
  // The kernel N(log b; μ, τ²)·Δ is the same for every lot: computed once per species.
  const kernel = mus.map((mu) => logRates.map((lr) => logNormalPdf(lr, mu, c.tau) + Math.log(dLogRate)));
  const contributions = new Map<string, number[]>();
  for (const [lotId, m] of marginals) {
    let top = Number.NEGATIVE_INFINITY;
    for (const v of m) if (v > top) top = v;
    const scaled = m.map((v) => Math.exp(v - top));
    contributions.set(
      lotId,
      kernel.map((row) => {
        let sum = 0;
        for (let i = 0; i < row.length; i++) sum += scaled[i]! * Math.exp(row[i]!);
        return top + Math.log(sum);
      }),
    );
  }
  const logPrior = mus.map((mu) => logNormalPdf(mu, m0, omega));
  const total = logPrior.slice();
  for (const contrib of contributions.values()) contrib.forEach((v, i) => (total[i] = total[i]! + v));
  const grid: SpeciesGrid = { mus, marginals, logPrior, contributions, rates: logRates };

  return lots.map((lot) => {
    const failed = failures.get(lot.id);
    if (failed) return { ok: false, lotId: lot.id, reason: failed };
    return fitLot(lot, grid, total, heldBackByLot.get(lot.id) ?? new Set());
  });
}

function fitLot(lot: ModelLot, grid: SpeciesGrid, total: number[], heldBack: Set<string>): LotModelResult {
  const c = MODEL_CONSTANTS;
  const own = grid.contributions.get(lot.id);
  // The species' rate without this lot's own evidence, then the lot's rate prior around it.
  const loo = total.map((v, i) => v - (own ? own[i]! : 0));
  const looNorm = logSumExp(loo);
  const muWeights = loo.map((v) => Math.exp(v - looNorm));
  const otherLotsInform = grid.contributions.size - (own ? 1 : 0) > 0;
  const logRatePrior = (lr: number) =>
    Math.log(
      Math.max(
        LOG_EPS,
        grid.mus.reduce((s, mu, i) => s + muWeights[i]! * Math.exp(logNormalPdf(lr, mu, c.tau)), 0),
      ),
    );

  // Posterior over (log b, K): log b on a grid, K integrated around its conditional mode.
  const marginal = grid.marginals.get(lot.id);
  const coarse = grid.rates.map((lr, i) => logRatePrior(lr) + (marginal ? marginal[i]! : 0));
  const norm = logSumExp(coarse);
  const w = coarse.map((v) => Math.exp(v - norm));
  const mean = w.reduce((s, wi, i) => s + wi * grid.rates[i]!, 0);
  const sd = Math.sqrt(
    Math.max(
      0,
      w.reduce((s, wi, i) => s + wi * (grid.rates[i]! - mean) ** 2, 0),
    ),
  );
  const step = grid.rates[1]! - grid.rates[0]!;
  const half = Math.max(2 * step, 6 * sd);
  const fine = linspace(mean - half, mean + half, RATE_GRID);
  const points: Point[] = [];
  const logs: number[] = [];
  for (const lr of fine) {
    const b = Math.exp(lr);
    const prior = logRatePrior(lr);
    const cond = conditionalK(lot.assays, heldBack, b);
    cond.ks.forEach((k, i) => {
      points.push({ k, b, w: 0 });
      logs.push(prior + cond.logs[i]!);
    });
  }
  const z = logSumExp(logs);
  if (!Number.isFinite(z))
    return { ok: false, lotId: lot.id, reason: 'Its tests could not be fitted together.' };
  points.forEach((p, i) => (p.w = Math.exp(logs[i]! - z)));
  const kept = resample(points, DRAWS);

  const ownAges = new Set(lot.assays.filter((t) => !heldBack.has(t.id)).map((t) => t.age));
  const priorSd = Math.sqrt(c.tau * c.tau + Math.max(0, weightedVariance(grid.mus, muWeights)));
  const basis: LotModel['basis'] =
    ownAges.size >= 2 && sd < 0.8 * priorSd ? 'lot' : otherLotsInform ? 'species' : 'typical';
  const initial = band(kept, (p) => phi(p.k));
  const rate = quantile(kept, (p) => p.b, 0.5);
  const notes: string[] = [];
  if (heldBack.size > 0) {
    notes.push(
      'A later test came up far better than an earlier one: the earlier test may have been held back by dormancy or by conditions, so it is read only as "at least this many were alive", not as decline.',
    );
  }
  if (lot.assays.length === 0)
    notes.push(
      'Not tested: this is the species’ typical figure for a lot of this age and storage, a guess until a test.',
    );
  else if (lot.assays.every((t) => t.evidence))
    notes.push(
      'No counted test yet: rough scores and what came up from sowings say less than a count, so the band stays wide.',
    );
  return {
    ok: true,
    model: {
      lotId: lot.id,
      basis,
      estimateOnly: lot.assays.length === 0,
      initial,
      rate,
      sigmaYears: 1 / rate,
      halfLifeYears: quantile(kept, (p) => Math.max(0, p.k / p.b), 0.5),
      heldBack: [...heldBack],
      notes,
      points: kept,
    },
  };
}

/** Systematic resampling: `n` equally weighted draws that follow the grid's weights. */
function resample(points: readonly Point[], n: number): Point[] {
  const out: Point[] = [];
  let acc = 0;
  let j = 0;
  for (const p of points) {
    acc += p.w;
    while (j < n && (j + 0.5) / n <= acc) {
      out.push({ k: p.k, b: p.b, w: 1 / n });
      j += 1;
    }
  }
  while (out.length < n) out.push({ ...points.at(-1)!, w: 1 / n });
  return out;
}

function weightedVariance(xs: readonly number[], ws: readonly number[]): number {
  const m = xs.reduce((s, x, i) => s + x * ws[i]!, 0);
  return xs.reduce((s, x, i) => s + ws[i]! * (x - m) ** 2, 0);
}

/** Weighted quantile of f over the posterior points. */
function quantile(points: readonly Point[], f: (p: Point) => number, q: number): number {
  const xs = points.map((p) => ({ x: f(p), w: p.w })).sort((a, b) => a.x - b.x);
  const total = xs.reduce((s, x) => s + x.w, 0);
  let acc = 0;
  for (const x of xs) {
    acc += x.w;
    if (acc >= q * total) return x.x;
  }
  return xs.at(-1)!.x;
}

/**
 * The posterior median and its central band, in percent. The median, not the mean, so the figure
 * always lies inside its band (the mean of a skewed distribution near 0% can lie above it).
 */
function band(points: readonly Point[], f: (p: Point) => number, confidence = 0.95): Band {
  const xs = points.map((p) => ({ x: f(p), w: p.w })).sort((a, b) => a.x - b.x);
  const total = xs.reduce((s, x) => s + x.w, 0);
  const tail = (1 - confidence) / 2;
  const at = (q: number) => {
    let acc = 0;
    for (const x of xs) {
      acc += x.w;
      if (acc >= q * total) return x.x;
    }
    return xs.at(-1)!.x;
  };
  return { percent: 100 * at(0.5), low: 100 * at(tail), high: 100 * at(1 - tail) };
}

/** Viability at an equivalent age: the posterior median and its central 95% band, in percent. */
export function projectModel(model: Pick<LotModel, 'points'>, age: number, confidence = 0.95): Band {
  return band(model.points, (p) => phi(p.k - p.b * age), confidence);
}

/** The posterior distribution of viability at an equivalent age, as weighted values (for seeds to sow). */
export function viabilityDistribution(
  model: Pick<LotModel, 'points'>,
  age: number,
): { p: number; w: number }[] {
  return model.points.map((pt) => ({ p: phi(pt.k - pt.b * age), w: pt.w }));
}

/**
 * The monitoring interval in equivalent years: one third of the time the lot takes to fall to 85%
 * of its initial viability (FAO Genebank Standards 2014, 4.3.3 — from memory, see REFERENCES.md),
 * from the posterior medians of its initial viability and rate.
 */
export function monitoringIntervalYears(model: Pick<LotModel, 'points'>): number {
  const times = model.points.map((p) => ({ x: (p.k - normalQuantile(0.85 * phi(p.k))) / p.b, w: p.w }));
  return (
    quantile(
      times.map((t) => ({ k: t.x, b: 1, w: t.w })),
      (p) => p.k,
      0.5,
    ) / 3
  );
}
