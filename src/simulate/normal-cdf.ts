/**
 * Smooth step functions used for the phase II front of the simulated capnogram.
 *
 * - `erfc`: complementary error function, Chebyshev fit with fractional error below 1.2e-7 everywhere
 *   [Press WH et al. 1992, Numerical Recipes in C, 2nd ed., Cambridge University Press, section 6.2, function erfcc].
 * - `normalCdf(z)` = Phi(z) = 0.5 * erfc(-z / sqrt 2) (standard normal distribution function).
 * - `emgCdf(x, sigma, tail)`: distribution function of an exponentially modified Gaussian (a normal of SD sigma
 *   convolved with an exponential of mean `tail`), used for the optional skewed front:
 *   F(x) = Phi(x/sigma) - exp(-x/tail + sigma^2/(2 tail^2)) * Phi(x/sigma - sigma/tail)
 *   [common practice, no source: standard convolution result]. Its mean is `tail`, its mode lies left of the mean.
 */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t *
          (1.00002368 +
            t *
              (0.37409196 +
                t *
                  (0.09678418 +
                    t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return x >= 0 ? r : 2 - r;
}

/** Standard normal distribution function Phi(z). @example normalCdf(0) // 0.5 */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / Math.SQRT2);
}

/** Exponentially modified Gaussian distribution function (see file comment); tail <= 0 falls back to the normal. */
export function emgCdf(x: number, sigma: number, tail: number): number {
  if (!(tail > 0)) return normalCdf(x / sigma);
  const b = x / sigma - sigma / tail;
  const a = -x / tail + (sigma * sigma) / (2 * tail * tail);
  let product: number;
  if (b < -8) {
    // exp(a) * Phi(b) with Phi(b) ~ phi(b)/|b| * (1 - 1/b^2 + 3/b^4); a - b^2/2 = -x^2/(2 sigma^2) keeps it finite.
    const b2 = b * b;
    product = (Math.exp(-(x * x) / (2 * sigma * sigma)) / (-b * Math.sqrt(2 * Math.PI))) * (1 - 1 / b2 + 3 / (b2 * b2));
  } else {
    product = a > 700 ? 0 : Math.exp(a) * normalCdf(b);
  }
  const f = normalCdf(x / sigma) - product;
  return f < 0 ? 0 : f > 1 ? 1 : f;
}
