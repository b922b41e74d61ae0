/**
 * What a model takes from a material entry: weight density for self-weight and dead load, the shear modulus
 * where the entry has none but gives Poisson's ratio, and the engine member's E and density.
 */
import type { MaterialEntry } from "./document";

/** Standard gravity, m/s² (the conventional value of the CGPM, 1901): ρg of a library density. */
export const STANDARD_GRAVITY = 9.80665;

/** Weight density ρg, N/m³, or null where the entry has no density. */
export function weightDensity(material: MaterialEntry): number | null {
  return material.density ? material.density.value * STANDARD_GRAVITY : null;
}

/**
 * G = E / (2(1 + ν)) of an isotropic elastic material — the relation EN 1993-1-1 3.2.6 and EN 1999-1-1 3.2.5
 * give for steel and aluminium. Throws for E ≤ 0 or ν outside [0, 0.5), which no library entry can hold.
 */
export function shearModulusFromPoisson(E: number, nu: number): number {
  if (!(Number.isFinite(E) && E > 0)) throw new Error(`Young's modulus must be a positive number, not ${E}.`);
  if (!(Number.isFinite(nu) && nu >= 0 && nu < 0.5))
    throw new Error(`Poisson's ratio must be at least 0 and below 0.5, not ${nu}.`);
  return E / (2 * (1 + nu));
}

/** The shear modulus a run uses: the entry's G where it gives one, else from E and ν, else null. */
export function materialShearModulus(material: MaterialEntry): { value: number; from: "listed" | "poisson" } | null {
  if (material.G) return { value: material.G.value, from: "listed" };
  if (material.nu) return { value: shearModulusFromPoisson(material.E.value, material.nu.value), from: "poisson" };
  return null;
}

/** The engine member's material properties (lib/engine's Member: E in Pa, density in kg/m³). */
export function memberMaterial(material: MaterialEntry): { E: number; density?: number } {
  return material.density ? { E: material.E.value, density: material.density.value } : { E: material.E.value };
}
