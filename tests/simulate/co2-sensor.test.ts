// CO2 sensor chain: transport delay and first-order response measured on a step.
import { describe, it } from 'vitest';
import { createCo2Sensor } from '../../src/simulate/co2-sensor';
import { expectClose } from '../helpers/expect-close';

/** Feed a 0 -> 40 mmHg step at t = 0.1 s into the sensor at fs Hz; return the crossing times of 10/50/90 %. */
function stepCrossings(delayS: number, riseMs: number, fs: number): { t10: number; t50: number; t90: number } {
  const sensor = createCo2Sensor(delayS, riseMs, fs, 0);
  const out: number[] = [];
  for (let i = 0; i < fs * (delayS + 2); i++) out.push(sensor.step(i / fs >= 0.1 ? 40 : 0));
  const cross = (level: number): number => {
    const k = out.findIndex((y) => y >= level);
    // linear interpolation between samples k-1 and k
    return (k - 1 + (level - out[k - 1]!) / (out[k]! - out[k - 1]!)) / fs;
  };
  return { t10: cross(4), t50: cross(20), t90: cross(36) };
}

describe('CO2 sensor model', () => {
  it('tau 100 ms <-> 10-90 % rise time 219.7 ms (ln 9 x tau)', () => {
    // [derived here: docs/methods.md, Derivations] 100 ms x ln 9 = 219.7 ms
    const { t10, t90 } = stepCrossings(0, 219.7, 10000);
    expectClose(t90 - t10, 0.2197, { abs: 0.0005 });
  });
  it('a 1.5 s transport delay shifts the response by 1.5 s', () => {
    const fast = stepCrossings(0, 150, 1000);
    const slow = stepCrossings(1.5, 150, 1000);
    expectClose(slow.t50 - fast.t50, 1.5, { abs: 0.002 });
    expectClose(slow.t90 - slow.t10, 0.15, { abs: 0.003 });
  });
});
