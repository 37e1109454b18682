// --shard I/N: a deterministic 1/N of the inputs, so a cluster job array can run the shards independently.
// Rule: after expansion and sorting (expand-inputs.ts), input number k (0-based) belongs to shard k mod N.
// Round-robin over the sorted list spreads neighbouring (often similar-sized) recordings over all shards. Every shard
// must see the same input list; the manifest records its hash so `batch merge` can refuse shards that did not.

export interface Shard {
  /** 0-based shard index (Slurm: $SLURM_ARRAY_TASK_ID with --array=0-(N-1)) */
  index: number;
  count: number;
}

export class ShardError extends Error {}

/** Parses "I/N" (0 <= I < N); throws ShardError with a one-line message otherwise. */
export function parseShard(text: string): Shard {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || !(count >= 1) || !(index < count)) {
    throw new ShardError(
      `--shard needs I/N with 0 <= I < N, got "${text}". Shards count from 0: --shard 0/10 ... --shard 9/10 (Slurm: --array=0-9 and --shard $SLURM_ARRAY_TASK_ID/10).`,
    );
  }
  return { index, count };
}

/** The items of one shard, in their original order. */
export function selectShard<T>(items: readonly T[], shard: Shard): T[] {
  return items.filter((_, k) => k % shard.count === shard.index);
}
