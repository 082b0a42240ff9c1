/**
 * Gauss–Legendre quadrature. The nodes are the zeros of the Legendre polynomial P_m, found by
 * Newton's method from the Tricomi starting values cos(π(i − ¼)/(m + ½)), and the weights are
 * 2/((1 − x²)·P_m′(x)²) (Abramowitz & Stegun 1964, eq. 25.4.29; Davis & Rabinowitz 1984, §2.7).
 * They are computed once per order, not tabulated.
 */

export interface QuadratureRule {
  readonly nodes: readonly number[];
  readonly weights: readonly number[];
}

/** The m-point Gauss–Legendre rule on [−1, 1] (m from 2 to 200). */
export function gaussLegendreRule(order: number): QuadratureRule {
  if (!Number.isInteger(order) || order < 2 || order > 200) {
    throw new RangeError(`gaussLegendreRule: order must be an integer from 2 to 200, got ${order}`);
  }
  const nodes = new Array<number>(order);
  const weights = new Array<number>(order);
  const half = Math.floor((order + 1) / 2);
  for (let i = 1; i <= half; i++) {
    let x = Math.cos((Math.PI * (i - 0.25)) / (order + 0.5));
    let derivative = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      // Bonnet's recurrence (k+1)P_{k+1} = (2k+1)xP_k − kP_{k−1}.
      let previous = 1;
      let current = x;
      for (let k = 1; k < order; k++) {
        const next = ((2 * k + 1) * x * current - k * previous) / (k + 1);
        previous = current;
        current = next;
      }
      derivative = (order * (x * current - previous)) / (x * x - 1);
      const step = current / derivative;
      x -= step;
      if (Math.abs(step) < 1e-15) break;
    }
    const weight = 2 / ((1 - x * x) * derivative * derivative);
    nodes[i - 1] = -x;
    nodes[order - i] = x;
    weights[i - 1] = weight;
    weights[order - i] = weight;
  }
  return { nodes, weights };
}
