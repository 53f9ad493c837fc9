import { describe, expect, it } from 'vitest';
import {
  harringtonLifeFactor,
  harringtonStorageOk,
  sigmaForStorage,
  sigmaFromViabilityConstants,
  temperatureFactor,
  UNIVERSAL_TEMPERATURE_TERMS,
} from '#server/stats/index';

// Lettuce constants K_E 8.218, C_W 4.797, C_H 0.0489, C_Q 0.000365 (Kraak & Vos 1987) — from memory
// (marked [memory — confirm before use] in REFERENCES.md).
const LETTUCE_FROM_MEMORY = { kE: 8.218, cW: 4.797, cH: 0.0489, cQ: 0.000365 };

describe('sigmaFromViabilityConstants', () => {
  it('when lettuce is stored at 6% moisture and 20 °C, then σ ≈ 2297 days and 95% → 85% takes ≈ 1398 days', () => {
    // REFERENCES.md: σ ≈ 2297 days, 95% → 85% in ≈ 1398 days (computed from the memory constants;
    // equation of Ellis & Roberts 1980).
    const sigma = sigmaFromViabilityConstants(LETTUCE_FROM_MEMORY, 6, 20);
    expect(Math.abs(sigma - 2297)).toBeLessThan(1);
    expect(Math.abs(0.60842 * sigma - 1398)).toBeLessThan(1);
  });

  it('when moisture is not positive, then it throws a RangeError', () => {
    expect(() => sigmaFromViabilityConstants(LETTUCE_FROM_MEMORY, 0, 20)).toThrow(RangeError);
  });
});

describe('temperatureFactor', () => {
  it('when storage goes from 20 °C to 5 °C, then σ grows by 10^(C_H·15 + C_Q·(20² − 5²))', () => {
    // Universal terms C_H = 0.0329, C_Q = 0.000478 (Dickie et al. 1990); worked by hand: 10^0.67275 ≈ 4.7071.
    expect(UNIVERSAL_TEMPERATURE_TERMS).toEqual({ cH: 0.0329, cQ: 0.000478 });
    expect(temperatureFactor(5, 20)).toBeCloseTo(10 ** (0.0329 * 15 + 0.000478 * 375), 12);
    expect(temperatureFactor(5, 20)).toBeCloseTo(4.7071, 3);
    expect(temperatureFactor(20, 20)).toBe(1);
  });

  it('when compared with the full equation, then it is the ratio of the σ values at equal moisture', () => {
    // log₁₀σ = K_E − C_W log₁₀m − C_H T − C_Q T² (Ellis & Roberts 1980) with the universal terms.
    const constants = { kE: 8, cW: 4.8, ...UNIVERSAL_TEMPERATURE_TERMS };
    const ratio =
      sigmaFromViabilityConstants(constants, 7, -18) / sigmaFromViabilityConstants(constants, 7, 15);
    expect(temperatureFactor(-18, 15)).toBeCloseTo(ratio, 8);
  });
});

describe("Harrington's rules of thumb", () => {
  it('when moisture drops 1% or temperature 5 °C, then storage life roughly doubles (Harrington 1972)', () => {
    expect(harringtonLifeFactor(1)).toBe(2);
    expect(harringtonLifeFactor(2, 10)).toBe(16);
    expect(harringtonLifeFactor(-1)).toBe(0.5);
  });

  it('when RH% + °F is at most 100, then storage is good (Harrington 1972)', () => {
    expect(harringtonStorageOk(40, 15)).toBe(true); // 40 + 59 = 99
    expect(harringtonStorageOk(50, 21)).toBe(false); // 50 + 69.8 = 119.8
  });
});

describe('sigmaForStorage', () => {
  it("when the species' moisture constant is known, then moisture scales σ by (m/m_ref)^−C_W (Ellis & Roberts 1980)", () => {
    const r = sigmaForStorage({
      referenceSigmaYears: 2,
      referenceTemperatureC: 20,
      temperatureC: 5,
      referenceMoisturePercent: 8,
      moisturePercent: 6,
      moistureCoefficient: 4.797,
    });
    expect(r.moistureMethod).toBe('viability-equation');
    expect(r.moistureFactor).toBeCloseTo((6 / 8) ** -4.797, 12);
    expect(r.sigmaYears).toBeCloseTo(2 * temperatureFactor(5, 20) * (6 / 8) ** -4.797, 10);
  });

  it('when only moisture contents are known, then moisture uses Harrington (doubling per 1%) and says it is an estimate', () => {
    const r = sigmaForStorage({
      referenceSigmaYears: 2,
      referenceTemperatureC: 20,
      temperatureC: 20,
      referenceMoisturePercent: 9,
      moisturePercent: 7,
    });
    expect(r.moistureMethod).toBe('harrington');
    expect(r.sigmaYears).toBeCloseTo(8, 12); // 2 years × 2² (Harrington 1972)
    expect(r.notes.join(' ')).toMatch(/rule of thumb/);
  });

  it('when moisture is unknown, then only temperature is scaled and a note says so', () => {
    const r = sigmaForStorage({ referenceSigmaYears: 3, referenceTemperatureC: 20, temperatureC: -18 });
    expect(r.moistureMethod).toBe('none');
    expect(r.sigmaYears).toBeCloseTo(3 * temperatureFactor(-18, 20), 10);
    expect(r.notes).toHaveLength(1);
  });

  it('when moisture lies outside 5–25%, then a note warns that the equation may not hold', () => {
    // Validity roughly 5–25% moisture (REFERENCES.md, read, secondary).
    const r = sigmaForStorage({
      referenceSigmaYears: 3,
      referenceTemperatureC: 20,
      temperatureC: 20,
      referenceMoisturePercent: 30,
      moisturePercent: 8,
      moistureCoefficient: 5,
    });
    expect(r.notes.join(' ')).toMatch(/outside/);
  });

  it('when the reference σ is not positive, then it throws a RangeError', () => {
    expect(() =>
      sigmaForStorage({ referenceSigmaYears: 0, referenceTemperatureC: 20, temperatureC: 5 }),
    ).toThrow(RangeError);
  });
});
