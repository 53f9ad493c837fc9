import { daysBetween } from './dates';

/** Days in the year that seed age is counted in (the mean calendar year, leap days included). */
export const YEAR_DAYS = 365.25;

/**
 * Seed age in years on `date`, counted from the viability model's age zero (`harvestReference`),
 * both YYYY-MM-DD: the server projects with it and the decline chart places tests by it, so a
 * test sits on the chart where the model put it.
 */
export function seedAgeYears(harvestReference: string, date: string): number {
  return daysBetween(harvestReference, date) / YEAR_DAYS;
}
