import { PBW_BASE_HEIGHT_CM, predictedBodyWeight, type Sex } from '../physiology/predicted-body-weight';

export type WeightBasis = 'predicted_body_weight' | 'actual_weight' | 'none';

export interface WeightChoice {
  basis: WeightBasis;
  /** kg used to normalise per-kg values; NaN for 'none' */
  weight_kg: number;
  note: string;
  warnings: string[];
}

/**
 * Body weight used for per-kg dead-space values: predicted body weight (ARDSNet, cm form) for adults
 * when height and sex are given, otherwise actual weight, otherwise none.
 * PBW formula: men 50 + 0.91 (height_cm - 152.4), women 45.5 + 0.91 (height_cm - 152.4) kg
 * [ARDS Network 2000, N Engl J Med 342:1301-1308; Devine BJ 1974, Drug Intell Clin Pharm 8:650-655]. The formula is for
 * adults and unsuitable for small stature [published: Martin & Richards 2017 BMC Pulm Med]: below 152.4 cm it is
 * not used (actual weight instead, with a warning).
 */
export function chooseWeight(opts: { weight_kg?: number; height_cm?: number; sex?: Sex }): WeightChoice {
  const warnings: string[] = [];
  const actual = opts.weight_kg !== undefined && opts.weight_kg > 0 ? opts.weight_kg : NaN;
  if (opts.height_cm !== undefined && opts.sex !== undefined) {
    if (opts.height_cm >= PBW_BASE_HEIGHT_CM) {
      const pbw = predictedBodyWeight(opts.height_cm, opts.sex);
      return {
        basis: 'predicted_body_weight',
        weight_kg: pbw,
        note: `predicted body weight ${pbw.toFixed(1)} kg (ARDSNet: ${opts.sex === 'male' ? '50' : '45.5'} + 0.91 x (height_cm - 152.4))`,
        warnings,
      };
    }
    warnings.push(
      `height ${opts.height_cm} cm is below 152.4 cm, where the adult predicted-body-weight formula does not apply; ` +
        (Number.isFinite(actual) ? 'per-kg values use the actual weight' : 'give the weight to get per-kg values'),
    );
  }
  if (Number.isFinite(actual)) {
    return { basis: 'actual_weight', weight_kg: actual, note: `actual weight ${actual} kg`, warnings };
  }
  return { basis: 'none', weight_kg: NaN, note: 'no weight given: per-kg values left empty', warnings };
}
