// Batch progress on stderr: a cli-progress bar on a terminal (files done, rows/s, ETA), plain log lines otherwise
// (one per finished recording, for log files and cluster job output). The bar advances by bytes, so the ETA
// weighs a 24-hour file more than a 10-minute one.
import cliProgress from 'cli-progress';
import type { RecordingResult } from './process-recording';

export interface ProgressItem {
  recording: string;
  size: number;
}

export interface Progress {
  done(item: ProgressItem, r: RecordingResult, rows: number | null): void;
  stop(): void;
}

export interface ProgressOptions {
  mode: 'bar' | 'lines' | 'none';
  stream?: NodeJS.WritableStream;
}

function rate(rows: number, seconds: number): string {
  if (!(seconds > 0) || rows <= 0) return '-';
  const r = rows / seconds;
  return r >= 1e6 ? `${(r / 1e6).toFixed(2)}M` : r >= 1e3 ? `${(r / 1e3).toFixed(0)}k` : r.toFixed(0);
}

/** Remaining time from the bytes done so far (the bar's own ETA jumps when the first file is a small one). */
function eta(elapsedS: number, bytes: number, total: number): string {
  if (bytes <= 0 || bytes >= total) return bytes >= total ? '0s' : '-';
  const s = Math.round((elapsedS * (total - bytes)) / bytes);
  return s >= 3600 ? `${Math.floor(s / 3600)}h${String(Math.floor((s % 3600) / 60)).padStart(2, '0')}m` : s >= 60 ? `${Math.floor(s / 60)}m${String(s % 60).padStart(2, '0')}s` : `${s}s`;
}

export function createProgress(items: readonly ProgressItem[], opts: ProgressOptions): Progress {
  const stream = opts.stream ?? process.stderr;
  const n = items.length;
  const totalBytes = Math.max(1, items.reduce((s, i) => s + i.size, 0));
  const t0 = performance.now();
  let files = 0;
  let failed = 0;
  let rows = 0;
  let bytes = 0;
  if (opts.mode === 'none') return { done() {}, stop() {} };
  if (opts.mode === 'lines') {
    return {
      done(item, r, rowCount) {
        files++;
        const head = `[${files}/${n}]`;
        let line: string;
        if (r.status === 'failed') line = `${head} failed ${item.recording}: ${r.error?.message ?? ''}`;
        else if (r.resumed) line = `${head} kept   ${item.recording} (unchanged input and settings; --resume)`;
        else {
          rows += rowCount ?? 0;
          line = `${head} ok     ${item.recording}: ${r.breaths_found} breaths (${r.breaths_ok} ok), ${rowCount} rows in ${r.elapsed_s.toFixed(2)} s`;
        }
        stream.write(line + '\n');
      },
      stop() {},
    };
  }
  const bar = new cliProgress.SingleBar(
    {
      // {remaining}, not {eta}: cli-progress fills its own {eta} token with a bare number of seconds
      format: 'batch [{bar}] {percentage}% | {files}/{nfiles} files | {failed} failed | {rate} rows/s | ETA {remaining}',
      stream: stream as NodeJS.WriteStream,
      hideCursor: true,
      fps: 5,
    },
    cliProgress.Presets.shades_classic,
  );
  bar.start(totalBytes, 0, { files: 0, nfiles: n, failed: 0, rate: '-', remaining: '-' });
  return {
    done(item, r, rowCount) {
      files++;
      bytes += item.size;
      if (r.status === 'failed') failed++;
      else if (!r.resumed) rows += rowCount ?? 0;
      const elapsed = (performance.now() - t0) / 1000;
      bar.update(Math.min(bytes, totalBytes), { files, failed, rate: rate(rows, elapsed), remaining: eta(elapsed, bytes, totalBytes) });
    },
    stop() {
      // a stopped batch (Ctrl-C) leaves the bar where the finished recordings put it, as the manifest counts them
      if (files === n) bar.update(totalBytes);
      bar.stop();
    },
  };
}
