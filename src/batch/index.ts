// Batch mode (Node only): many recordings -> per-recording outputs, two tables and a manifest.

// Running a batch and merging shards
export { runBatch, inputListHash, BATCH_EXIT_SOME_FAILED, BatchUsageError, type BatchOptions, type BatchOutcome } from './run-batch';
export { mergeShards, MergeError, type MergeOutcome } from './merge';
export { runTasks, defaultWorkerFile, WORKER_BUNDLE } from './pool';
export { processRecording, describeError, BREATHS_FILE, SUMMARY_FILE, type RecordingTask, type RecordingResult } from './process-recording';

// Inputs, shards, settings
export { expandInputs, recordingId, isOutputFolder, RECORDING_EXTENSIONS, type BatchInput, type ExpandedInputs } from './expand-inputs';
export { globToRegExp, hasGlobChars, patternMatches, toPosix } from './glob';
export { parseShard, selectShard, ShardError, type Shard } from './shard';
export { settingsPlan, settingsForRecording, type SettingsPlan, type RecordingSettings, type FilePattern } from './file-settings';
export { sha256File, sha256Json, canonicalJson } from './hash';

// Outputs
export { outputFolders, safeName, RECORDINGS_DIR } from './output-names';
export { writeBatchTables, BATCH_BREATHS_FILE, BATCH_RECORDINGS_FILE } from './tables';
export { recordingRow, RECORDING_COLUMNS } from './recordings-table';
export {
  readManifest, manifestJson, countEntries, withoutTiming, MANIFEST_FILE, MANIFEST_FORMAT, TIMING_FIELDS,
  type Manifest, type ManifestEntry, type EntryStatus,
} from './manifest';
export { createProgress, type Progress, type ProgressItem, type ProgressOptions } from './progress';
