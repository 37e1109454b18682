// Settings of a batch: one base set for every recording, plus the settings file's per-file-pattern overrides.
// Precedence for one recording (later wins): defaults < settings file (top level) < each `files` entry whose pattern
// matches the recording, in file order < command-line options. Command-line options win everywhere, as they do
// for `analyse` ("options given here win"). A pattern is matched against the recording's path below the input it was
// found in (BatchInput.patternPaths, rule in patternMatches), so a settings file works from any working folder; a
// pattern that matches no recording of the batch is a warning (unmatchedPatternWarnings).
import { defaultSettings, type Settings } from '../settings';
import { applySettings, type GasFileSettings, type SettingsFile } from '../settings-file';
import { resolveSettings } from '../node/resolve-settings';
import { sha256Json } from './hash';
import type { BatchInput } from './expand-inputs';
import { patternMatches, toPosix } from './glob';

type Patch = { ingest?: Partial<Settings['ingest']>; analysis?: Partial<Settings['analysis']>; events?: Partial<Settings['events']> };
export type FilePattern = NonNullable<SettingsFile['files']>[number];

export interface SettingsPlan {
  /** settings for a recording no pattern matches */
  base: Settings;
  /** dotted keys set by the user for the base ("analysis.delay_s") */
  baseGiven: string[];
  /** the settings file's per-file-pattern overrides */
  files: FilePattern[];
  settingsFile: string | null;
  /** settings file (top level) and command-line options as patches */
  fileTop: Patch;
  cli: Patch;
  /** the settings file's top-level `gas` section (blood-gas constants; used by `analyse --gas`, not by batch) */
  gas: GasFileSettings;
  /** SHA-256 of the base settings, the given keys and the pattern list (canonical JSON) */
  sha256: string;
}

export interface RecordingSettings {
  settings: Settings;
  given: string[];
  /** patterns of the settings file that applied */
  patterns: string[];
  /** SHA-256 of { settings, given } (canonical JSON) */
  sha256: string;
  /** blood-gas constants: the settings file's `gas` section, then the `gas` of each matching pattern (later wins);
   *  not in sha256, as batch has no blood-gas input */
  gas: GasFileSettings;
}

function patchFrom(settings: Settings, given: Iterable<string>): Patch {
  const patch: Record<'ingest' | 'analysis' | 'events', Record<string, unknown>> = { ingest: {}, analysis: {}, events: {} };
  for (const key of given) {
    const [group, name] = key.split('.') as ['ingest' | 'analysis' | 'events', string];
    patch[group][name] = (settings[group] as unknown as Record<string, unknown>)[name];
  }
  return patch as Patch;
}

/** Builds the plan from the command's options (the same options `analyse` takes, including --settings). */
export function settingsPlan(opts: Record<string, unknown>): SettingsPlan {
  const all = resolveSettings(opts);
  const cliOnly = resolveSettings({ ...opts, settings: undefined });
  const file = all.file;
  const fileTop: Patch = {
    ...(file?.ingest ? { ingest: file.ingest } : {}),
    ...(file?.analysis ? { analysis: file.analysis } : {}),
    ...(file?.events ? { events: file.events } : {}),
  };
  const baseGiven = [...all.given].sort();
  const files = file?.files ?? [];
  return {
    base: all.settings,
    baseGiven,
    files,
    settingsFile: typeof opts.settings === 'string' ? opts.settings : null,
    fileTop,
    cli: patchFrom(cliOnly.settings, cliOnly.given),
    gas: { ...(file?.gas ?? {}) },
    sha256: sha256Json({ settings: all.settings, given: baseGiven, files }),
  };
}

/**
 * The settings one recording is analysed with.
 * @param patternPaths the paths the `files` patterns are matched against (a pattern applies when it matches any)
 */
export function settingsForRecording(plan: SettingsPlan, patternPaths: readonly string[]): RecordingSettings {
  const settings = defaultSettings();
  const given = new Set<string>();
  applySettings(settings, plan.fileTop, given);
  const patterns: string[] = [];
  let gas: GasFileSettings = { ...plan.gas };
  for (const f of plan.files) {
    if (!patternPaths.some((p) => patternMatches(f.pattern, p))) continue;
    applySettings(settings, f, given);
    if (f.gas) gas = { ...gas, ...f.gas };
    patterns.push(f.pattern);
  }
  applySettings(settings, plan.cli, given);
  const sortedGiven = [...given].sort();
  return { settings, given: sortedGiven, patterns, sha256: sha256Json({ settings, given: sortedGiven }), gas };
}

/**
 * One warning per `files` pattern that matches none of the batch's recordings (all of them, before sharding, so a
 * shard does not warn about a pattern that applies in another shard). It names the pattern, says what patterns are
 * matched against with an example from this batch, and, when the pattern matches a recording's path from the
 * working folder instead (`data/site-b/*.csv` for `phasewise batch data/`), names that recording.
 */
export function unmatchedPatternWarnings(plan: SettingsPlan, inputs: readonly Pick<BatchInput, 'recording' | 'patternPaths'>[]): string[] {
  const warnings: string[] = [];
  const paths = inputs.flatMap((i) => i.patternPaths);
  for (const pattern of new Set(plan.files.map((f) => f.pattern))) {
    if (inputs.some((i) => i.patternPaths.some((p) => patternMatches(pattern, p)))) continue;
    // an example of what the pattern was compared with, with a folder in it when the pattern has one
    const example = (toPosix(pattern).includes('/') ? paths.find((p) => p.includes('/')) : undefined) ?? paths[0];
    const fromCwd = inputs.find((i) => patternMatches(pattern, i.recording));
    warnings.push(
      `settings file pattern "${pattern}" matches no recording; patterns are matched against each recording's path relative to the input folder it was found in` +
        ` (for a file given directly, its file name; a pattern without "/" against each folder and file name in that path)` +
        (example === undefined ? '' : `, e.g. "${example}"`) +
        (fromCwd ? `; it matches "${fromCwd.recording}" only as a path from the working folder: write the path below the input folder` : ''),
    );
  }
  return warnings;
}

/**
 * A warning when the settings file holds blood-gas constants (`gas`, at the top level or in a `files` entry): batch
 * has no blood-gas input, so they are not used (they apply to `analyse --gas` and the viewer); empty otherwise.
 */
export function unusedGasWarnings(plan: Pick<SettingsPlan, 'gas' | 'files' | 'settingsFile'>): string[] {
  const where = [
    ...(Object.keys(plan.gas).length ? ['the top-level "gas" section'] : []),
    ...plan.files.filter((f) => f.gas && Object.keys(f.gas).length).map((f) => `the "gas" of pattern "${f.pattern}"`),
  ];
  if (!where.length) return [];
  return [
    `settings file ${plan.settingsFile ?? ''}: ${where.join(', ')} not used: batch has no blood-gas input; the gas constants apply to \`phasewise analyse --gas\``,
  ];
}
