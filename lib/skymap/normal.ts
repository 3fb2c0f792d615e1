/**
 * The standard normal distribution to near double precision, for the distance ansatz's truncated moments.
 * erfc: the series erf(z) = 2/√π · e^(−z²) · Σ 2ⁿ z^(2n+1) / (1·3·…·(2n+1)) below z = 2 (all terms positive, so no
 * cancellation), Lentz's continued fraction erfc(z) = e^(−z²)/√π · 1/(z + 1/2/(z + 1/(z + 3/2/(z + …)))) above
 * (Abramowitz & Stegun 1964, 7.1.6 and 7.1.14).
 */
const SQRT_PI = Math.sqrt(Math.PI);
const SQRT_2 = Math.SQRT2;
const TINY = 1e-300;

/** Complementary error function for z ≥ 0. */
function erfcPositive(z: number): number {
  if (z < 2) {
    let term = z;
    let sum = z;
    for (let n = 1; n < 200; n++) {
      term *= (2 * z * z) / (2 * n + 1);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
    return 1 - (2 / SQRT_PI) * Math.exp(-z * z) * sum;
  }
  return (Math.exp(-z * z) / SQRT_PI) * continuedFraction(z);
}

/** 1/(z + a1/(z + a2/(z + …))) with a_k = k/2 by the modified Lentz method. */
function continuedFraction(z: number): number {
  let f = z;
  let c = z;
  let d = 0;
  for (let k = 1; k < 500; k++) {
    const a = k / 2;
    d = z + a * d;
    d = Math.abs(d) < TINY ? TINY : d;
    c = z + a / c;
    c = Math.abs(c) < TINY ? TINY : c;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return 1 / f;
}

export function erfc(z: number): number {
  return z >= 0 ? erfcPositive(z) : 2 - erfcPositive(-z);
}

/** Standard normal density φ(x). */
export function normalPdf(x: number): number {
  return Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
}

/** Standard normal distribution function Φ(x) = erfc(−x/√2) / 2. */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / SQRT_2);
}

/**
 * φ(x)/Φ(x) (the inverse Mills ratio). Below x = −2, Φ(x) = erfc(z)/2 = e^(−x²/2) · F(z) / (2√π) with z = −x/√2 and
 * F the continued fraction above, so φ/Φ = √2 / F(z): the Gaussian factor cancels instead of underflowing.
 */
export function inverseMillsRatio(x: number): number {
  if (x >= -2) return normalPdf(x) / normalCdf(x);
  return SQRT_2 / continuedFraction(-x / SQRT_2);
}
