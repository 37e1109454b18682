// Every setting of src/settings.ts as a form, built from the settings-file schema (src/settings-file.ts) so the
// form offers exactly the keys, choices and limits the CLI accepts. The settings the user changed (value differs
// from the default) form the `given` set and the exported settings file, so `phasewise analyse FILE --settings
// that-file.json` records the same origins as the viewer and writes the same summary.json.

import { z } from 'zod';
import { defaultSettings, SETTING_GROUPS, type Settings, applySettings, parseSettingsFile, type SettingsFile, type GasFileSettings } from '../src/index';
import { settingsFileSchema } from '../src/settings-file';
import { h } from './dom';

export type Group = (typeof SETTING_GROUPS)[number];

export interface FieldSpec<G extends string = Group> {
  group: G;
  key: string;
  nullable: boolean;
  kind: 'enum' | 'number' | 'integer' | 'string' | 'boolean';
  options: string[];
  min: number;
  max: number;
  /** the minimum itself is refused (a positive number) */
  minExclusive?: boolean;
}

/** The field description of one key of a settings-file schema group. */
export function specOf<G extends string>(group: G, key: string, s0: z.ZodType): FieldSpec<G> {
  let s: z.ZodType = s0;
  let nullable = false;
  while (s instanceof z.ZodOptional || s instanceof z.ZodNullable) {
    if (s instanceof z.ZodNullable) nullable = true;
    s = s.unwrap() as z.ZodType;
  }
  const spec: FieldSpec<G> = { group, key, nullable, kind: 'string', options: [], min: -Infinity, max: Infinity };
  if (s instanceof z.ZodEnum) {
    spec.kind = 'enum';
    spec.options = (s.options as (string | number)[]).map(String);
  } else if (s instanceof z.ZodNumber) {
    spec.kind = s.isInt ? 'integer' : 'number';
    spec.min = s.minValue ?? -Infinity;
    spec.max = s.maxValue ?? Infinity;
    spec.minExclusive = Number.isFinite(spec.min) && !s.safeParse(spec.min).success;
  } else if (s instanceof z.ZodBoolean) spec.kind = 'boolean';
  return spec;
}

/** Field descriptions read from the zod schemas. */
export function fieldSpecs(): FieldSpec[] {
  const out: FieldSpec[] = [];
  const top = settingsFileSchema.shape as unknown as Record<string, z.ZodType>;
  for (const group of SETTING_GROUPS) {
    let schema = top[group]!;
    while (schema instanceof z.ZodOptional) schema = schema.unwrap() as z.ZodType;
    if (!(schema instanceof z.ZodObject)) continue;
    for (const [key, s0] of Object.entries(schema.shape)) out.push(specOf(group, key, s0 as z.ZodType));
  }
  return out;
}

/** The range hint of a number field ("> 0, ≤ 3600"); empty for other kinds. */
export function rangeHint(spec: FieldSpec<string>): string {
  if (spec.kind !== 'number' && spec.kind !== 'integer') return '';
  return [
    Number.isFinite(spec.min) ? `${spec.minExclusive ? '>' : '≥'} ${spec.min}` : '',
    Number.isFinite(spec.max) && spec.max < 1e15 ? `≤ ${spec.max}` : '',
  ].filter(Boolean).join(', ');
}

const DEFAULTS = defaultSettings() as unknown as Record<Group, Record<string, unknown>>;

/** Dotted keys whose value differs from the default. */
export function changedKeys(s: Settings): Set<string> {
  const out = new Set<string>();
  for (const g of SETTING_GROUPS) {
    for (const [k, v] of Object.entries(s[g])) if (v !== DEFAULTS[g][k]) out.add(`${g}.${k}`);
  }
  return out;
}

/** The settings file the CLI reads: only the changed keys (so their origin is `given` in both tools). */
export function changedSettingsFile(s: Settings): SettingsFile {
  const file: SettingsFile = {};
  for (const key of changedKeys(s)) {
    const [g, k] = key.split('.') as [Group, string];
    const part = ((file as Record<string, Record<string, unknown>>)[g] ??= {});
    part[k] = (s[g] as unknown as Record<string, unknown>)[k];
  }
  return file;
}

/** The settings file text: the changed settings and, when any is set, the blood-gas constants (`gas`). */
export function settingsFileText(s: Settings, gas: GasFileSettings = {}): string {
  const file: SettingsFile = changedSettingsFile(s);
  if (Object.keys(gas).length) file.gas = gas;
  return JSON.stringify(file, null, 2) + '\n';
}

/** Reads a settings file (the CLI's format) into full settings and its blood-gas constants; throws SettingsError with a one-line message. */
export function settingsFromFile(text: string, name: string): { settings: Settings; gas: GasFileSettings; ignoredFiles: number } {
  const file = parseSettingsFile(text, name);
  const settings = defaultSettings();
  applySettings(settings, file, new Set());
  return { settings, gas: file.gas ?? {}, ignoredFiles: file.files?.length ?? 0 };
}

/** Checks full settings against the schema; returns a one-line problem or null. */
export function settingsProblem(s: Settings): string | null {
  try {
    parseSettingsFile(JSON.stringify(changedSettingsFile(s)), 'settings');
    return null;
  } catch (e) {
    return (e as Error).message.replace(/^settings: /, '').replace(/ See the settings table in docs\/manual\.md\.$/, '');
  }
}

function show(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (v === '\t') return 'tab';
  return String(v);
}

/** Parses a form value; returns undefined when it cannot be a value of this field. */
export function parseField(spec: FieldSpec<string>, raw: string | boolean): unknown {
  if (spec.kind === 'boolean') return Boolean(raw);
  const text = String(raw).trim();
  if (text === '' || text === 'auto') return spec.nullable ? null : undefined;
  if (spec.kind === 'number' || spec.kind === 'integer') {
    const x = Number(text.replace(',', '.'));
    return Number.isFinite(x) ? x : undefined;
  }
  if (spec.key === 'delimiter') return text === 'tab' || text === '\\t' ? '\t' : text;
  return text;
}

/** One labelled control bound to `get()` / `set(value)`. */
export function fieldControl(spec: FieldSpec, get: () => Settings, set: (value: unknown) => void, autoLabel?: string): HTMLElement {
  const id = `set-${spec.group}-${spec.key}`;
  const value = (get()[spec.group] as unknown as Record<string, unknown>)[spec.key];
  const def = DEFAULTS[spec.group][spec.key];
  let input: HTMLInputElement | HTMLSelectElement;
  if (spec.kind === 'enum') {
    const sel = h('select', { id, name: spec.key });
    if (spec.nullable) sel.append(h('option', { value: '', text: autoLabel ?? 'auto / none' }));
    for (const o of spec.options) sel.append(h('option', { value: o, text: o }));
    sel.value = show(value);
    input = sel;
  } else if (spec.kind === 'boolean') {
    input = h('input', { id, name: spec.key, type: 'checkbox' });
    input.checked = Boolean(value);
  } else {
    input = h('input', {
      id,
      name: spec.key,
      type: 'text',
      inputmode: spec.kind === 'string' ? null : 'decimal',
      placeholder: spec.nullable ? autoLabel ?? 'auto / none' : show(def),
      autocomplete: 'off',
      spellcheck: 'false',
    });
    input.value = show(value);
  }
  const onChange = () => {
    const raw = input instanceof HTMLInputElement && input.type === 'checkbox' ? input.checked : input.value;
    const v = parseField(spec, raw);
    if (v === undefined) {
      input.classList.add('invalid');
      return;
    }
    input.classList.remove('invalid');
    set(v);
  };
  input.addEventListener('change', onChange);
  const range = rangeHint(spec);
  const hint = `default ${def === null ? 'auto / none' : show(def)}${range ? ` · ${range}` : ''}`;
  return h('div', { class: 'field' }, [h('label', { for: id, text: spec.key }), input, h('small', { text: hint })]);
}

/** Writes a value into settings (copy-on-write). */
export function withSetting(s: Settings, group: Group, key: string, value: unknown): Settings {
  const next = { ...s } as Settings;
  for (const g of SETTING_GROUPS) (next as unknown as Record<string, unknown>)[g] = { ...s[g] };
  (next[group] as unknown as Record<string, unknown>)[key] = value;
  return next;
}
