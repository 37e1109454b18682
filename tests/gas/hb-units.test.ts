// Haemoglobin in the gas file: the column name declares the unit (hb_g_dl, hb_g_l, hb_mmol_l); values are converted
// to g/dL with the monomer molar mass 16 114.5 g/mol (ICSH 1996, J Clin Pathol 49:271-274: 1 mmol/L = 1.61145 g/dL,
// derived here); a value outside the plausible range of its declared unit is rejected with the unit it looks like.
// Plausible ranges: g/dL 2-25 (our choice, no source), g/L 20-250 and mmol/L 1.24-15.51 (the same range converted,
// derived here). Worked by hand (derived here): 8.0 mmol/L = 12.8916 g/dL; 120 g/L = 12 g/dL; 1.5 mmol/L = 2.42 g/dL.
import { describe, expect, it } from 'vitest';
import { analyseGas, parseGasCsv } from '../../src/gas/index';
import { expectClose } from '../helpers/expect-close';
import { breathSeries } from './make-breath';

const reasons = (text: string) => Object.fromEntries(parseGasCsv(text, 'g.csv').rejected.map((x) => [x.line, x.reason]));

describe('Hb column units (parseGasCsv)', () => {
  it('hb_mmol_l and hb_g_l are converted to g/dL and the given value and unit are kept', () => {
    const r = parseGasCsv('time_s,paco2_mmhg,hb_mmol_l\n60,40,8.0\n', 'g.csv');
    expect(r.rejected).toEqual([]);
    expectClose(r.samples[0]!.hb_g_dl, 12.8916, { abs: 1e-9 });
    expect(r.samples[0]!.hb_given).toEqual({ value: 8, unit: 'mmol/L' });
    const l = parseGasCsv('time_s,paco2_mmhg,hb_g_l\n60,40,120\n', 'g.csv');
    expectClose(l.samples[0]!.hb_g_dl, 12, { abs: 1e-12 });
    expect(l.samples[0]!.hb_given).toEqual({ value: 120, unit: 'g/L' });
  });

  it('hb_g_dl is taken as is (no conversion record)', () => {
    const r = parseGasCsv('time_s,paco2_mmhg,hb_g_dl\n60,40,8.2\n', 'g.csv');
    expect(r.samples[0]!.hb_g_dl).toBe(8.2);
    expect(r.samples[0]!.hb_given).toBeUndefined();
  });

  it('a value outside its unit range is rejected naming line, column, value and the unit it looks like', () => {
    const text = 'time_s,paco2_mmhg,hb_g_dl\n60,40,120\n70,40,1.5\n80,40,400\n';
    const r = reasons(text);
    expect(r[2]).toBe('line 2, column hb_g_dl: 120 is outside 2-25 g/dL; looks like g/L (= 12.0 g/dL); name the column hb_g_l');
    expect(r[3]).toBe('line 3, column hb_g_dl: 1.5 is outside 2-25 g/dL; looks like mmol/L (= 2.4 g/dL); name the column hb_mmol_l');
    expect(r[4]).toBe('line 4, column hb_g_dl: 400 is outside 2-25 g/dL and fits no Hb unit (g/dL, g/L, mmol/L); check the value');
    const mmol = reasons('time_s,paco2_mmhg,hb_mmol_l\n60,40,18\n70,40,130\n');
    expect(mmol[2]).toBe('line 2, column hb_mmol_l: 18 is outside 1.24-15.51 mmol/L; looks like g/dL (= 18.0 g/dL); name the column hb_g_dl');
    expect(mmol[3]).toBe('line 3, column hb_mmol_l: 130 is outside 1.24-15.51 mmol/L; looks like g/L (= 13.0 g/dL); name the column hb_g_l');
    const gl = reasons('time_s,paco2_mmhg,hb_g_l\n60,40,8.2\n');
    expect(gl[2]).toBe(
      'line 2, column hb_g_l: 8.2 is outside 20-250 g/L; looks like g/dL (= 8.2 g/dL) or mmol/L (= 13.2 g/dL); name the column hb_g_dl or hb_mmol_l',
    );
  });

  it('two Hb columns, or an Hb column whose unit is not declared by one of the three names, stop the file', () => {
    expect(() => parseGasCsv('time_s,paco2_mmhg,hb_g_dl,hb_mmol_l\n60,40,13,8\n', 'g.csv')).toThrow(
      "g.csv: Hb is given in two columns (hb_g_dl, hb_mmol_l); keep one",
    );
    for (const name of ['hb', 'hb [g/L]', 'hgb_g_dl', 'haemoglobin', 'ctHb (mmol/L)']) {
      expect(() => parseGasCsv(`time_s,paco2_mmhg,${name}\n60,40,13\n`, 'g.csv')).toThrow(
        `g.csv: column '${name.toLowerCase()}' looks like haemoglobin but its unit is not declared; name it hb_g_dl, hb_g_l or hb_mmol_l`,
      );
    }
  });
});

describe('Hb units end to end (parseGasCsv -> analyseGas)', () => {
  const breaths = breathSeries(5, 12, { petco2_mmhg: 35, peco2_mmhg: 25, vt_exp_ml: 500, vd_aw_ml: 150, vdvt_bohr: 0.3 });
  const shunt = (hbHeader: string, hb: number) => {
    const text = `time_s,paco2_mmhg,pao2_mmhg,sao2_pct,svo2_pct,${hbHeader},fio2_pct\n60,40,95,97,70,${hb},40\n`;
    const parsed = parseGasCsv(text, 'g.csv');
    expect(parsed.rejected).toEqual([]);
    return analyseGas(breaths, parsed.samples, { pb_mmhg: 760 }).rows[0]!;
  };

  it('8.0 mmol/L gives the shunt fraction of 12.8916 g/dL, not that of 8.0 g/dL, and gas.csv shows the Hb used', () => {
    const mmol = shunt('hb_mmol_l', 8.0);
    const gdl = shunt('hb_g_dl', 12.8916);
    expect(mmol.shunt_method).toBe('contents');
    expectClose(mmol.shunt_fraction, gdl.shunt_fraction, { abs: 1e-12 });
    expect(Math.abs(mmol.shunt_fraction - shunt('hb_g_dl', 8.0).shunt_fraction)).toBeGreaterThan(0.005);
    expectClose(mmol.hb_g_dl, 12.8916, { abs: 1e-9 });
    expect(mmol.notes).toContain('Hb 8 mmol/L = 12.89 g/dL');
    expect(gdl.notes).not.toContain('Hb ');
  });
});
