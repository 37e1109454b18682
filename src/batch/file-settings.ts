// Settings of a batch: one base set for every recording, plus the settings file's per-file-pattern overrides.
// Precedence for one recording (later wins): defaults < settings file (top level) < each `files` entry whose pattern
// matches the recording, in file order < command-line options. Command-line options win everywhere, as they do
// for `analyse` ("options given here win").
import { defaultSettings, type Settings } from '../settings';
import { applySettings, type SettingsFile } from '../settings-file';
import { resolveSettings } from '../node/resolve-settings';
import { sha256Json } from './hash';
import { patternMatches } from './glob';

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
    sha256: sha256Json({ settings: all.settings, given: baseGiven, files }),
  };
}

/** The settings one recording is analysed with. */
export function settingsForRecording(plan: SettingsPlan, recording: string): RecordingSettings {
  const settings = defaultSettings();
  const given = new Set<string>();
  applySettings(settings, plan.fileTop, given);
  const patterns: string[] = [];
  for (const f of plan.files) {
    if (!patternMatches(f.pattern, recording)) continue;
    applySettings(settings, f, given);
    patterns.push(f.pattern);
  }
  applySettings(settings, plan.cli, given);
  const sortedGiven = [...given].sort();
  return { settings, given: sortedGiven, patterns, sha256: sha256Json({ settings, given: sortedGiven }) };
}
