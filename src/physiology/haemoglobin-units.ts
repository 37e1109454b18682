/** Units in which a haemoglobin concentration may be given. */
export type HbUnit = 'g/dL' | 'g/L' | 'mmol/L';

/**
 * Molar mass of the haemoglobin monomer (one globin chain with its haem), g/mol: a quarter of the tetramer's
 * 64 458 g/mol. Source: International Council for Standardization in Haematology, Expert Panel on Haemoglobinometry
 * 1996, J Clin Pathol 49:271-274, "Recommendations for reference method for haemoglobinometry in human blood (ICSH
 * standard 1995)". Haemoglobin in mmol/L is conventionally the monomer (one O2-binding haem per mole).
 */
export const HB_MONOMER_MOLAR_MASS_G_PER_MOL = 16114.5;

/**
 * g/dL per unit of each Hb unit: g/L / 10; mmol/L x 16 114.5 g/mol / 1000 mmol/mol / 10 dL/L = 1.61145 (derived here).
 */
export const G_PER_DL_PER_HB_UNIT: Readonly<Record<HbUnit, number>> = {
  'g/dL': 1,
  'g/L': 0.1,
  'mmol/L': HB_MONOMER_MOLAR_MASS_G_PER_MOL / 1000 / 10,
};

/** A haemoglobin concentration in g/dL from a value in the given unit (G_PER_DL_PER_HB_UNIT). NaN propagates. */
export function hbToGPerDl(value: number, unit: HbUnit): number {
  return value * G_PER_DL_PER_HB_UNIT[unit];
}
