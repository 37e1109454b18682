// Node edge: one recording file -> analysis outputs (used by `analyse` and `batch`).
import { createHash } from 'node:crypto';
import { createAnalyser, type BreathEvent } from '../analyse/analyser';
import type { AnalysisCore } from '../analyse/analyser';
import type { IngestReport } from '../ingest/index';
import type { Settings } from '../settings';
import type { SampleBlock } from '../types';
import { readRecordingFile } from './read-recording';
import { ReaderThread, readWorkerFile } from './reader-thread';

export { readWorkerFile } from './reader-thread';

/** The analysis of one file; the outputs (summary, trends, tables) are composed by src/report/outputs.ts. */
export interface FileAnalysis {
  core: AnalysisCore;
  report: IngestReport;
  /** SHA-256 of the file's bytes when asked for (hash: true), else null */
  sha256: string | null;
}

export interface AnalyseFileOptions {
  /**
   * Where the file is read and parsed: 'here' (this thread), 'thread' (a reader thread started for this file when
   * the bundled dist/read-worker.cjs is there, else here; the `analyse` command), or a running ReaderThread (the
   * batch pool's, shared by the files of one lane). The results are the same either way (identical blocks; tested).
   */
  read?: 'here' | 'thread' | ReaderThread;
  /** also compute the SHA-256 of the file's bytes, from the same read */
  hash?: boolean;
  /** called with every decomposed breath (its geometry and samples, valid during the call only): `analyse --report`
   *  keeps the expired curves; the results are the same with or without it (tested) */
  onBreath?: (e: BreathEvent) => void;
}

/** Streams the file through the reader into the analyser; memory holds breath rows, not samples. */
export async function analyseFile(path: string, settings: Settings, options: AnalyseFileOptions = {}): Promise<FileAnalysis> {
  const analyser = createAnalyser(settings, options.onBreath);
  const push = (b: SampleBlock) => analyser.push(b);
  const hash = options.hash === true;
  let read = options.read ?? 'here';
  let own: ReaderThread | null = null;
  if (read === 'thread') {
    const file = readWorkerFile();
    read = file ? (own = new ReaderThread(file)) : 'here';
  }
  try {
    if (read === 'here') {
      const h = hash ? createHash('sha256') : null;
      const report = await readRecordingFile(path, settings.ingest, settings.analysis.min_rate_hz, push, h ? (b) => h.update(b) : undefined);
      return { core: analyser.finish(), report, sha256: h ? h.digest('hex') : null };
    }
    const r = await read.read(path, settings, push, hash);
    return { core: analyser.finish(), report: r.report, sha256: r.sha256 };
  } finally {
    if (own) void own.close();
  }
}
