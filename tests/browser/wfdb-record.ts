// A WFDB record for the viewer's browser tests (viewer-formats.test.ts, view-command.test.ts), written from the
// format's own description (Moody GB, WFDB Applications Guide, header(5) and signal(5); PhysioNet WFDB Software
// Package), independently of phasewise's reader.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT } from './harness';

const SIM = join(ROOT, 'tests', 'fixtures', 'edf', 'sim.csv');

/**
 * A WFDB record of the simulated recording the EDF fixtures were written from (tests/fixtures/edf/sim.csv: 60 s at
 * 100 Hz, flow with 4 decimals in L/s, CO2 with 2 in mmHg), spelt out here from the header(5) and signal(5)
 * descriptions: one signal file in format 16 (16-bit two's complement, least significant byte first), the two
 * signals interleaved sample by sample; gain 10000 ADC units per L/s and 100 per mmHg with baseline 0, so each
 * physical value (digital / gain) is exactly the CSV's decimal; the checksum is the 16-bit sum of each signal's
 * samples. Writes DIR/wfdb/rec.hea and rec.dat; returns DIR/wfdb.
 */
export function writeWfdbRecord(dir: string): string {
  const out = join(dir, 'wfdb');
  mkdirSync(out, { recursive: true });
  const rows = readFileSync(SIM, 'utf8').trim().split('\n').slice(1).map((l) => l.split(',').map(Number));
  const dat = Buffer.alloc(rows.length * 4);
  const sums = [0, 0];
  rows.forEach(([, flow, co2], i) => {
    const f = Math.round(flow! * 10000);
    const c = Math.round(co2! * 100);
    dat.writeInt16LE(f, 4 * i);
    dat.writeInt16LE(c, 4 * i + 2);
    sums[0] = (sums[0]! + f) & 0xffff;
    sums[1] = (sums[1]! + c) & 0xffff;
  });
  const signed = (v: number) => (v >= 0x8000 ? v - 0x10000 : v);
  writeFileSync(join(out, 'rec.dat'), dat);
  writeFileSync(
    join(out, 'rec.hea'),
    `rec 2 100 ${rows.length}\nrec.dat 16 10000/L/s 16 0 ${Math.round(rows[0]![1]! * 10000)} ${signed(sums[0]!)} 0 Flow\n` +
      `rec.dat 16 100/mmHg 16 0 ${Math.round(rows[0]![2]! * 100)} ${signed(sums[1]!)} 0 CO2\n`,
  );
  return out;
}
