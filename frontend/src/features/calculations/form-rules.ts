/*
 * Validation of the optimisation forms, mirroring the API's DTOs (FitDto, GrowDto, YieldDto) so a
 * request the API would refuse is stopped where it is typed. Fields are kept as typed text.
 */
import { parseNumberInput } from '../../lib/format';

/** A react-hook-form rule on a text field (typed for forms that also hold non-text fields). */
type Rule = (value: unknown) => true | string;

function parsed(value: unknown): number | null {
  return typeof value === 'string' ? parseNumberInput(value) : null;
}

/** A number from `min` to `max` (inclusive unless `above` says min itself is out). */
export function numberIn(what: string, min: number, max: number, unit = '', above = false): Rule {
  return (text) => {
    const v = parsed(text);
    const ok = v !== null && (above ? v > min : v >= min) && v <= max;
    return (
      ok ||
      `${what} must be a number ${above ? 'above' : 'from'} ${min}${above ? ' and at most' : ' to'} ${max}${unit}`
    );
  };
}

/** A whole number from `min` to `max`. */
export function wholeIn(what: string, min: number, max: number): Rule {
  return (text) => {
    const v = parsed(text);
    return (
      (v !== null && Number.isInteger(v) && v >= min && v <= max) ||
      `${what} must be a whole number from ${min} to ${max}`
    );
  };
}

/** The max thickness must not be below the min thickness (the API refuses min > max). */
export function notBelowMin(minText: unknown): Rule {
  return (text) => {
    const min = parsed(minText);
    const max = parsed(text);
    if (min === null || max === null) return true;
    return max >= min || `Max thickness must not be below min thickness (${min} nm)`;
  };
}

export function both(...rules: Rule[]): Rule {
  return (text) => {
    for (const rule of rules) {
      const r = rule(text);
      if (r !== true) return r;
    }
    return true;
  };
}
