/**
 * zod readers for one CSV cell (a trimmed string) → a value, shared by every Hilum CSV format.
 * Text cells lose the formula guard's apostrophe (see csv-file.ts); numbers use a point as decimal
 * separator; choices and yes/no are read in any letter case.
 */
import { z } from 'zod';
import { unprotectCsvText } from './csv-file';

export const blankToNull = (v: unknown) => (v === '' ? null : v);

export function text(max: number, what: string) {
  return z
    .string()
    .transform(unprotectCsvText)
    .pipe(z.string().max(max, { message: `${what} has at most ${max} characters.` }));
}

export function requiredText(max: number, what: string, missing: string) {
  return text(max, what).refine((v) => v !== '', { message: missing });
}

export function optionalText(max: number, what: string) {
  return text(max, what).transform((v) => (v === '' ? null : v));
}

export function wholeNumber(min: number, max: number, message: string) {
  return z
    .string()
    .regex(/^\d+$/, { message })
    .transform(Number)
    .pipe(z.number().int().min(min, { message }).max(max, { message }));
}

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

export function decimal(min: number, max: number, message: string) {
  return z
    .string()
    .regex(DECIMAL, { message })
    .transform(Number)
    .pipe(z.number().min(min, { message }).max(max, { message }));
}

/** A value from a fixed list, in any letter case. */
export function choice<T extends z.ZodType<unknown, string>>(values: T) {
  return z
    .string()
    .transform((v) => v.toLowerCase())
    .pipe(values);
}

const YES = new Set(['yes', 'true', '1']);

/** yes/no, also as true/false/1/0 in any letter case; an empty cell (or a missing column) is no. */
export function yesNo(message: string) {
  return choice(z.enum(['yes', 'no', 'true', 'false', '1', '0', ''], { message })).transform((v) =>
    YES.has(v),
  );
}

/** A date that exists, YYYY-MM-DD; empty is null. */
export function optionalDate(message = 'Use a date that exists, written YYYY-MM-DD, like 2026-05-24.') {
  return z.preprocess(blankToNull, z.iso.date({ message }).nullable());
}
