/**
 * Units for reporting (`units:` of the config): names for the model's length unit and for the
 * mass unit reports and mass targets use, and how many of the model's mass units make one of
 * those (`massScale`). A model exported in kg and reported in t: `{ length: m, mass: t,
 * massScale: 1000 }`, so 7850 (kg) in the matrices reads "7.85 t". Lengths are never scaled (the
 * DOF map's coordinates are the model's); frequencies stay in Hz. Without units every number is
 * shown as it was, in the model's own units, with no name.
 */
import { formatNumber } from './message.js';

export interface ReportUnits {
  /** Name of the model's length unit (the DOF map's coordinates): display only. */
  length?: string;
  /** Name of the mass unit of reports and mass targets. */
  mass?: string;
  /** Model mass units in one `mass` unit (default 1): shown mass = model mass / massScale. */
  massScale?: number;
}

/** A mass of the model (its own unit) in the reporting unit. */
export function massIn(units: ReportUnits | undefined, modelMass: number): number {
  return modelMass / (units?.massScale ?? 1);
}

/** `x` for a message: the number itself without a unit name (formatted as before), "7.85 t" with one. */
export function withUnit(x: number, unit: string | undefined): number | string {
  return unit ? `${formatNumber(x)} ${unit}` : x;
}

/** " m" after a parenthesised point, or nothing. */
export function unitSuffix(unit: string | undefined): string {
  return unit ? ` ${unit}` : '';
}

/** The inertia unit name (`t·m²`) when both names are given. */
export function inertiaUnit(units: ReportUnits | undefined): string | undefined {
  return units?.mass && units.length ? `${units.mass}·${units.length}²` : undefined;
}
