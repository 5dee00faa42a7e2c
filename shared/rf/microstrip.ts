/**
 * Quasi-static microstrip: characteristic impedance and effective permittivity from the strip width
 * (Hammerstad and Jensen, "Accurate Models for Microstrip Computer-Aided Design", IEEE MTT-S 1980),
 * the inverse (width for a wanted impedance), and the physical length of an electrical length.
 *
 * With u = w/h:
 *   Z01(u)   = η0/(2π) · ln( f(u)/u + √(1 + (2/u)²) ),   f(u) = 6 + (2π − 6)·exp(−(30.666/u)^0.7528)
 *   εeff(u)  = (εr + 1)/2 + (εr − 1)/2 · (1 + 10/u)^(−a(u)·b(εr))
 *   a(u)     = 1 + ln((u⁴ + (u/52)²)/(u⁴ + 0.432))/49 + ln(1 + (u/18.1)³)/18.7
 *   b(εr)    = 0.564 · ((εr − 0.9)/(εr + 3))^0.053
 *   Z0       = Z01(u)/√εeff(u)
 * Strip thickness t (T = t/h) widens the strip:
 *   Δu1 = (T/π) · ln(1 + 4e/(T · coth²√(6.517u))),   Δur = ½(1 + 1/cosh√(εr − 1)) · Δu1
 *   Z0 = Z01(u + Δur)/√εeff(u + Δur),   εeff = εeff(u + Δur) · (Z01(u + Δu1)/Z01(u + Δur))²
 * No dispersion: the values are the low-frequency limit.
 */

export interface Substrate {
  epsilonR: number;
  heightM: number;
  copperM?: number;
}

/** Non-physical microstrip input (negative width, εr < 1, an impedance no strip can reach, …). */
export class MicrostripError extends Error {
  readonly code = 'invalid-microstrip';
  constructor(message: string) {
    super(message);
    this.name = 'MicrostripError';
  }
}

/** Free-space wave impedance μ0·c (the CODATA μ0 with c exact): 376.730 Ω. */
const ETA0 = 376.730313668;
const SPEED_OF_LIGHT = 299_792_458;

/** The widths (as w/h) that synthesis searches; far beyond the formulas' stated range of 0.01 … 100. */
const U_MIN = 1e-4;
const U_MAX = 1e4;

function positiveFinite(value: number, what: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new MicrostripError(`${what} must be a positive finite number, got ${String(value)}`);
  }
}

function checkSubstrate(sub: Substrate): void {
  if (!sub || typeof sub !== 'object') throw new MicrostripError('the substrate needs epsilonR and heightM');
  if (typeof sub.epsilonR !== 'number' || !Number.isFinite(sub.epsilonR) || sub.epsilonR < 1) {
    throw new MicrostripError(`the substrate's relative permittivity must be a finite number of at least 1, got ${String(sub.epsilonR)}`);
  }
  positiveFinite(sub.heightM, "the substrate's height (m)");
  if (sub.copperM !== undefined && (typeof sub.copperM !== 'number' || !Number.isFinite(sub.copperM) || sub.copperM < 0)) {
    throw new MicrostripError(`the copper thickness must be zero or a positive finite number of metres, got ${String(sub.copperM)}`);
  }
}

/** Impedance of the strip with air as the dielectric. */
function z01(u: number): number {
  const f = 6 + (2 * Math.PI - 6) * Math.exp(-((30.666 / u) ** 0.7528));
  return (ETA0 / (2 * Math.PI)) * Math.log(f / u + Math.sqrt(1 + (2 / u) ** 2));
}

function epsEffZeroThickness(u: number, er: number): number {
  const a = 1 + Math.log((u ** 4 + (u / 52) ** 2) / (u ** 4 + 0.432)) / 49 + Math.log(1 + (u / 18.1) ** 3) / 18.7;
  const b = 0.564 * ((er - 0.9) / (er + 3)) ** 0.053;
  return (er + 1) / 2 + ((er - 1) / 2) * (1 + 10 / u) ** (-a * b);
}

function analyzeNormalised(u: number, er: number, t: number): { z0: number; epsilonEff: number } {
  if (t <= 0) {
    const e = epsEffZeroThickness(u, er);
    return { z0: z01(u) / Math.sqrt(e), epsilonEff: e };
  }
  const coth = 1 / Math.tanh(Math.sqrt(6.517 * u));
  const du1 = (t / Math.PI) * Math.log(1 + (4 * Math.E) / (t * coth * coth));
  const dur = 0.5 * (1 + 1 / Math.cosh(Math.sqrt(er - 1))) * du1;
  const u1 = u + du1;
  const ur = u + dur;
  const er0 = epsEffZeroThickness(ur, er);
  const zr = z01(ur);
  return { z0: zr / Math.sqrt(er0), epsilonEff: er0 * (z01(u1) / zr) ** 2 };
}

/** Characteristic impedance (Ω) and effective permittivity of a strip `widthM` wide on `sub`. */
export function microstripAnalyze(widthM: number, sub: Substrate): { z0: number; epsilonEff: number } {
  positiveFinite(widthM, 'the strip width (m)');
  checkSubstrate(sub);
  return analyzeNormalised(widthM / sub.heightM, sub.epsilonR, (sub.copperM ?? 0) / sub.heightM);
}

/**
 * The closed-form width for a wanted impedance (Wheeler's formulas as rearranged by Hammerstad),
 * as w/h: A = Z0/60·√((εr+1)/2) + (εr−1)/(εr+1)·(0.23 + 0.11/εr), u = 8e^A/(e^2A − 2) for
 * narrow strips; B = 377π/(2·Z0·√εr), u = (2/π)[B − 1 − ln(2B − 1) + (εr−1)/(2εr)(ln(B − 1) + 0.39 − 0.61/εr)]
 * for wide ones.
 */
function closedFormU(z0: number, er: number): number {
  const A = (z0 / 60) * Math.sqrt((er + 1) / 2) + ((er - 1) / (er + 1)) * (0.23 + 0.11 / er);
  const narrow = (8 * Math.exp(A)) / (Math.exp(2 * A) - 2);
  if (narrow > 0 && narrow < 2) return narrow;
  const B = (377 * Math.PI) / (2 * z0 * Math.sqrt(er));
  const wide = (2 / Math.PI) * (B - 1 - Math.log(2 * B - 1) + ((er - 1) / (2 * er)) * (Math.log(B - 1) + 0.39 - 0.61 / er));
  return Number.isFinite(wide) && wide > 0 ? wide : 1;
}

/**
 * The strip width for impedance `z0` on `sub`: a bracketed root find (bisection on ln u, finished
 * by the secant method inside the bracket) of the analysis above, started from the closed form.
 * Throws when no width between 1e-4·h and 1e4·h gives `z0`.
 */
export function microstripSynthesize(z0: number, sub: Substrate): { widthM: number; epsilonEff: number } {
  positiveFinite(z0, 'the characteristic impedance (Ω)');
  checkSubstrate(sub);
  const er = sub.epsilonR;
  const t = (sub.copperM ?? 0) / sub.heightM;
  // Z0 falls as the strip widens: g(ln u) = Z0(u) − z0 is decreasing.
  const g = (x: number) => analyzeNormalised(Math.exp(x), er, t).z0 - z0;
  let lo = Math.log(U_MIN);
  let hi = Math.log(U_MAX);
  const gLo = g(lo);
  const gHi = g(hi);
  if (gLo < 0 || gHi > 0) {
    const zMax = gLo + z0;
    const zMin = gHi + z0;
    throw new MicrostripError(
      `no microstrip width gives ${z0} Ω on this substrate (reachable: ${zMin.toFixed(2)} Ω to ${zMax.toFixed(1)} Ω)`,
    );
  }
  // Narrow the bracket around the closed-form start before the general search.
  const start = Math.log(Math.min(U_MAX, Math.max(U_MIN, closedFormU(z0, er))));
  for (const step of [0.05, 0.2, 1]) {
    const a = Math.max(lo, start - step);
    const b = Math.min(hi, start + step);
    if (g(a) >= 0 && g(b) <= 0) {
      lo = a;
      hi = b;
      break;
    }
  }
  let fLo = g(lo);
  let fHi = g(hi);
  for (let i = 0; i < 200 && hi - lo > 1e-14; i++) {
    // Secant (regula falsi) step, kept inside the bracket; bisection whenever it makes poor progress.
    let x = fLo !== fHi ? lo - (fLo * (hi - lo)) / (fHi - fLo) : (lo + hi) / 2;
    if (!(x > lo && x < hi) || i % 3 === 2) x = (lo + hi) / 2;
    const fx = g(x);
    if (fx === 0) {
      lo = hi = x;
      break;
    }
    if (fx > 0) {
      lo = x;
      fLo = fx;
    } else {
      hi = x;
      fHi = fx;
    }
  }
  const u = Math.exp((lo + hi) / 2);
  return { widthM: u * sub.heightM, epsilonEff: analyzeNormalised(u, er, t).epsilonEff };
}

/** Physical length (m) of `degrees` of electrical length at `atHz` on a line with `epsilonEff`. */
export function microstripPhysicalLength(degrees: number, atHz: number, epsilonEff: number): number {
  if (typeof degrees !== 'number' || !Number.isFinite(degrees) || degrees < 0) {
    throw new MicrostripError(`the electrical length must be zero or a positive finite number of degrees, got ${String(degrees)}`);
  }
  positiveFinite(atHz, 'the frequency (Hz)');
  if (typeof epsilonEff !== 'number' || !Number.isFinite(epsilonEff) || epsilonEff < 1) {
    throw new MicrostripError(`the effective permittivity must be a finite number of at least 1, got ${String(epsilonEff)}`);
  }
  const wavelength = SPEED_OF_LIGHT / (atHz * Math.sqrt(epsilonEff));
  return (degrees / 360) * wavelength;
}
