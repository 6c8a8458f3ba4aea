/**
 * Money units for per-money ratios on screen. A table is often kept in thousands of a currency, which makes jobs per
 * unit tiny (0.015 jobs per thousand dollars); planners read jobs per million. The unit is parsed from the table's
 * own words ("thousand dollars", "million euro", "dollars"); anything else is left as it is, with no other choice.
 */
const SCALES: Record<string, number> = { thousand: 1e3, thousands: 1e3, million: 1e6, millions: 1e6, billion: 1e9, billions: 1e9 };

export interface PerMoneyUnit {
  /** What the value is per, in words ("thousand dollars", "million dollars"). */
  label: string;
  /** Multiply a value per table unit by this to get the value per this unit. */
  factor: number;
}

/** The table's unit as a scale and a currency, or null when its words are not "[thousand|million|billion] currency". */
export function parseMoneyUnit(unit: string): { scale: number; currency: string } | null {
  const m = /^\s*(?:(thousands?|millions?|billions?)\s+(?:of\s+)?)?([^\d\s][^\d]*?)\s*$/i.exec(unit);
  if (!m) return null;
  return { scale: m[1] ? SCALES[m[1].toLowerCase()]! : 1, currency: m[2]! };
}

/** The units a per-money ratio can be shown in: the table's own, and a million of its currency when that differs. */
export function perMoneyUnits(tableUnit: string): PerMoneyUnit[] {
  const own = { label: tableUnit, factor: 1 };
  const p = parseMoneyUnit(tableUnit);
  if (!p || p.scale === 1e6) return [own];
  return [own, { label: `million ${p.currency}`, factor: 1e6 / p.scale }];
}
