import { assertFinite } from './validate';

/**
 * Constants of the seed viability equation (Ellis & Roberts 1980, Ann. Bot. 45:13–30):
 * log₁₀ σ = K_E − C_W log₁₀ m − C_H T − C_Q T², m moisture (% fresh weight), T in °C; published
 * constants give σ in days.
 */
export interface ViabilityConstants {
  kE: number;
  cW: number;
  cH: number;
  cQ: number;
}

/** Universal temperature terms, Dickie et al. 1990, Ann. Bot. 65:197–204. */
export const UNIVERSAL_TEMPERATURE_TERMS = { cH: 0.0329, cQ: 0.000478 } as const;

/** Moisture range (% fresh weight) over which the equation is said to hold (REFERENCES.md). */
const VALID_MOISTURE = { min: 5, max: 25 } as const;

/** σ from a full set of species constants (in the constants' unit of time, days for published sets). */
export function sigmaFromViabilityConstants(
  constants: ViabilityConstants,
  moisturePercent: number,
  temperatureC: number,
): number {
  assertFinite(temperatureC, 'temperatureC');
  assertFinite(moisturePercent, 'moisturePercent');
  if (moisturePercent <= 0)
    throw new RangeError(`moisturePercent must be positive (got ${String(moisturePercent)})`);
  const { kE, cW, cH, cQ } = constants;
  return 10 ** (kE - cW * Math.log10(moisturePercent) - cH * temperatureC - cQ * temperatureC * temperatureC);
}

/** σ(T) / σ(T_ref) at equal moisture, from the universal temperature terms. */
export function temperatureFactor(temperatureC: number, referenceTemperatureC: number): number {
  assertFinite(temperatureC, 'temperatureC');
  assertFinite(referenceTemperatureC, 'referenceTemperatureC');
  const { cH, cQ } = UNIVERSAL_TEMPERATURE_TERMS;
  return (
    10 **
    (-cH * (temperatureC - referenceTemperatureC) - cQ * (temperatureC ** 2 - referenceTemperatureC ** 2))
  );
}

/**
 * Harrington's rules of thumb (Harrington 1972): each 1% drop in seed moisture, and each 10 °F
 * (taken as 5 °C) drop in temperature, roughly doubles storage life. An estimate only.
 */
export function harringtonLifeFactor(moistureDropPercent: number, temperatureDropC = 0): number {
  assertFinite(moistureDropPercent, 'moistureDropPercent');
  assertFinite(temperatureDropC, 'temperatureDropC');
  return 2 ** moistureDropPercent * 2 ** (temperatureDropC / 5);
}

/** Harrington's storage guide: good when relative humidity (%) + temperature (°F) ≤ 100. */
export function harringtonStorageOk(relativeHumidityPercent: number, temperatureC: number): boolean {
  assertFinite(relativeHumidityPercent, 'relativeHumidityPercent');
  assertFinite(temperatureC, 'temperatureC');
  return relativeHumidityPercent + (temperatureC * 9) / 5 + 32 <= 100;
}

export interface StorageConditions {
  /** σ (years) known for the reference storage. */
  referenceSigmaYears: number;
  referenceTemperatureC: number;
  temperatureC: number;
  /** Seed moisture (% fresh weight) under the reference storage and under the storage asked about. */
  referenceMoisturePercent?: number;
  moisturePercent?: number;
  /** The species' moisture constant C_W, when known. */
  moistureCoefficient?: number;
}

export interface StorageSigma {
  sigmaYears: number;
  temperatureFactor: number;
  moistureFactor: number;
  moistureMethod: 'viability-equation' | 'harrington' | 'none';
  notes: string[];
}

/**
 * Scales a known σ to other storage. Temperature always uses the viability equation's universal
 * terms (Dickie et al. 1990). Moisture uses the species' C_W when given ((m/m_ref)^−C_W); with
 * moisture contents but no C_W, Harrington's doubling per 1% (an estimate); with moisture unknown,
 * no moisture adjustment is made and a note says so.
 */
export function sigmaForStorage(conditions: StorageConditions): StorageSigma {
  const { referenceSigmaYears, referenceTemperatureC, temperatureC } = conditions;
  assertFinite(referenceSigmaYears, 'referenceSigmaYears');
  if (referenceSigmaYears <= 0) throw new RangeError('referenceSigmaYears must be positive');
  const notes: string[] = [];
  const tFactor = temperatureFactor(temperatureC, referenceTemperatureC);
  const m = conditions.moisturePercent;
  const mRef = conditions.referenceMoisturePercent;
  let moistureFactor = 1;
  let moistureMethod: StorageSigma['moistureMethod'] = 'none';
  if (m === undefined || mRef === undefined) {
    notes.push(
      'Seed moisture unknown: σ scaled for temperature only. Drier seed keeps longer (Harrington: about twice as long per 1% less moisture).',
    );
  } else {
    assertFinite(m, 'moisturePercent');
    assertFinite(mRef, 'referenceMoisturePercent');
    if (m <= 0 || mRef <= 0) throw new RangeError('moisture contents must be positive');
    for (const value of [m, mRef]) {
      if (value < VALID_MOISTURE.min || value > VALID_MOISTURE.max) {
        notes.push(
          `Moisture ${String(value)}% lies outside the ${String(VALID_MOISTURE.min)}–${String(VALID_MOISTURE.max)}% range where the viability equation is said to hold.`,
        );
      }
    }
    if (conditions.moistureCoefficient !== undefined) {
      assertFinite(conditions.moistureCoefficient, 'moistureCoefficient');
      moistureFactor = (m / mRef) ** -conditions.moistureCoefficient;
      moistureMethod = 'viability-equation';
    } else {
      moistureFactor = harringtonLifeFactor(mRef - m);
      moistureMethod = 'harrington';
      notes.push(
        "The species' moisture constant is unknown: moisture effect estimated with Harrington's rule of thumb.",
      );
    }
  }
  return {
    sigmaYears: referenceSigmaYears * tFactor * moistureFactor,
    temperatureFactor: tFactor,
    moistureFactor,
    moistureMethod,
    notes,
  };
}
