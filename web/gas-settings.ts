// The blood-gas constants in the sidebar: every key of the settings file's `gas` section (gasSchema in
// src/settings-file.ts), read and checked as `phasewise analyse --settings` reads them, so that the viewer's gas table
// and the CLI's agree and the exported settings file carries them. window_s and cardiac_output_l_min keep their own
// fields among the patient options (#gas-window, #gas-co, the CLI's --gas-window and --cardiac-output); the other
// fields are built here from the schema, each showing its default (GAS_DEFAULTS). An empty field is the default.

import type { z } from 'zod';
import { GAS_DEFAULTS, type GasFileSettings } from '../src/index';
import { gasSchema } from '../src/settings-file';
import { byId, h } from './dom';
import { parseField, rangeHint, specOf, type FieldSpec } from './settings-form';

/** keys with a field of their own among the patient options */
const OWN_FIELDS: Readonly<Record<string, string>> = { window_s: 'gas-window', cardiac_output_l_min: 'gas-co' };

const SHAPE = gasSchema.shape as unknown as Record<string, z.ZodType>;

/** One spec per key of the gas section, in the schema's order. */
export function gasFieldSpecs(): FieldSpec<'gas'>[] {
  return Object.entries(SHAPE).map(([key, s]) => specOf('gas', key, s));
}

/** The id of the page field of a gas key. */
export function gasFieldId(key: string): string {
  return OWN_FIELDS[key] ?? `gas-set-${key}`;
}

export interface GasFieldsRead {
  /** the valid, non-empty fields */
  gas: GasFileSettings;
  /** keys whose text is not a valid value (left at the default) */
  invalid: string[];
  /** one line naming the first invalid key and why; null when all are valid */
  problem: string | null;
}

/** Reads field texts (by key) into a gas section with the settings file's checks; empty texts are left out. */
export function gasSettingsFromTexts(texts: Readonly<Record<string, string>>): GasFieldsRead {
  const gas: Record<string, unknown> = {};
  const invalid: string[] = [];
  let problem: string | null = null;
  for (const spec of gasFieldSpecs()) {
    const text = (texts[spec.key] ?? '').trim();
    if (text === '') continue;
    const v = parseField(spec, text);
    const r = SHAPE[spec.key]!.safeParse(v);
    if (v !== undefined && r.success) {
      gas[spec.key] = r.data;
      continue;
    }
    invalid.push(spec.key);
    problem ??= `blood-gas setting ${spec.key}: ${r.success ? 'not a number' : r.error.issues[0]!.message}; the default is used`;
  }
  return { gas: gas as GasFileSettings, invalid, problem };
}

function defaultText(key: string): string {
  const d = (GAS_DEFAULTS as Record<string, { value: unknown } | undefined>)[key];
  return d === undefined ? 'none' : String(d.value);
}

/** Builds the fields of the constants without a field of their own into `host`; `changed` runs on each change. */
export function renderGasConstants(host: HTMLElement, changed: () => void): void {
  host.replaceChildren();
  for (const spec of gasFieldSpecs()) {
    if (OWN_FIELDS[spec.key]) continue;
    const id = gasFieldId(spec.key);
    const input =
      spec.kind === 'enum'
        ? h('select', { id, name: spec.key }, [h('option', { value: '', text: `default (${defaultText(spec.key)})` }), ...spec.options.map((o) => h('option', { value: o, text: o }))])
        : h('input', { id, name: spec.key, type: 'text', inputmode: 'decimal', placeholder: defaultText(spec.key), autocomplete: 'off', spellcheck: 'false' });
    input.addEventListener('change', changed);
    const range = rangeHint(spec);
    host.append(h('label', { class: 'field' }, [spec.key, input, h('small', { text: `default ${defaultText(spec.key)}${range ? ` · ${range}` : ''}` })]));
  }
}

/** Reads every gas field of the page, marks the invalid ones and shows the first problem. */
export function readGasConstants(): GasFieldsRead {
  const texts: Record<string, string> = {};
  for (const spec of gasFieldSpecs()) texts[spec.key] = byId<HTMLInputElement | HTMLSelectElement>(gasFieldId(spec.key)).value;
  const read = gasSettingsFromTexts(texts);
  for (const spec of gasFieldSpecs()) byId(gasFieldId(spec.key)).classList.toggle('invalid', read.invalid.includes(spec.key));
  byId('gas-settings-error').textContent = read.problem ?? '';
  return read;
}

/** Puts a settings file's gas section into the page's fields (keys it does not hold are emptied: the default). */
export function writeGasConstants(gas: GasFileSettings): void {
  for (const spec of gasFieldSpecs()) {
    const v = (gas as Record<string, unknown>)[spec.key];
    byId<HTMLInputElement | HTMLSelectElement>(gasFieldId(spec.key)).value = v === undefined ? '' : String(v);
  }
  readGasConstants();
}
