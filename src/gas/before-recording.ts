// A blood gas drawn before the recording started (time_s < 0, from a negative time_s or a clock time before the
// recording's first stamp) is listed in the gas table with its note but used for nothing else: no breaths precede it.

/** True when a gas sample was drawn before the recording started (time_s < 0). */
export function isBeforeRecording(sample: { time_s: number }): boolean {
  return sample.time_s < 0;
}

/** The samples drawn at or after the recording's start, the ones the breaths can use. */
export function samplesInRecording<T extends { time_s: number }>(samples: readonly T[]): T[] {
  return samples.filter((s) => !isBeforeRecording(s));
}
