// Haemoglobin concentration units. 1 mmol/L of haemoglobin monomer (one haem, one globin chain) at the monomer molar
// mass 16 114.5 g/mol (a quarter of the tetramer's 64 458 g/mol; International Council for Standardization in
// Haematology, Expert Panel on Haemoglobinometry 1996, Recommendations for reference method for haemoglobinometry in
// human blood (ICSH standard 1995), J Clin Pathol 49:271-274) is 16.1145 g/L = 1.61145 g/dL. Expected values worked by
// hand (derived here): 8.2 mmol/L x 1.61145 = 13.21389 g/dL; 8.0 mmol/L = 12.8916 g/dL; 120 g/L / 10 = 12 g/dL.
import { describe, expect, it } from 'vitest';
import { HB_MONOMER_MOLAR_MASS_G_PER_MOL, hbToGPerDl } from '../../src/physiology/haemoglobin-units';
import { expectClose } from '../helpers/expect-close';

describe('hbToGPerDl', () => {
  it('monomer molar mass 16 114.5 g/mol: four of them make the 64 458 g/mol tetramer', () => {
    expect(HB_MONOMER_MOLAR_MASS_G_PER_MOL).toBe(16114.5);
    expectClose(4 * HB_MONOMER_MOLAR_MASS_G_PER_MOL, 64458, { abs: 1e-9 });
  });

  it('mmol/L: 8.2 -> 13.21389 g/dL, 8.0 -> 12.8916 g/dL', () => {
    expectClose(hbToGPerDl(8.2, 'mmol/L'), 13.21389, { abs: 1e-9 });
    expectClose(hbToGPerDl(8.0, 'mmol/L'), 12.8916, { abs: 1e-9 });
  });

  it('g/L: 120 -> 12 g/dL; g/dL unchanged', () => {
    expectClose(hbToGPerDl(120, 'g/L'), 12, { abs: 1e-12 });
    expect(hbToGPerDl(13.4, 'g/dL')).toBe(13.4);
  });
});
