// A breath row with every field NaN except the ones given (tests only).
import { blankBreathRow } from '../../src/metrics/registry';
import type { BreathRow } from '../../src/types';

export function breathRow(fields: Partial<BreathRow>): BreathRow {
  return { ...blankBreathRow(), breath: 0, ...fields };
}
