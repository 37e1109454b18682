// The settings screen: every setting as a form (settings-form.ts), save / load / reset, and "analyse again". Save,
// load and reset include the blood-gas constants of the review sidebar (gas-settings.ts), the file's `gas` section.

import { defaultSettings } from '../src/index';
import { fail, show, state } from './app-state';
import { byId, download } from './dom';
import { fieldControl, fieldSpecs, settingsFileText, settingsFromFile, settingsProblem, withSetting } from './settings-form';
import { readGasConstants, writeGasConstants } from './gas-settings';

export function renderSettingsForm(): void {
  const hosts: Record<string, HTMLElement> = { ingest: byId('settings-ingest'), analysis: byId('settings-analysis'), events: byId('settings-events') };
  for (const el of Object.values(hosts)) el.replaceChildren();
  for (const spec of fieldSpecs()) {
    hosts[spec.group]?.append(
      fieldControl(spec, () => state.settings, (v) => {
        state.settings = withSetting(state.settings, spec.group, spec.key, v);
        byId('settings-error').textContent = settingsProblem(state.settings) ?? '';
      }),
    );
  }
  byId('settings-error').textContent = settingsProblem(state.settings) ?? '';
  byId<HTMLButtonElement>('settings-apply').disabled = !state.file;
}

/**
 * @param changed called after the settings were replaced (reset or loaded), to refresh the mapping step
 * @param apply called by "analyse again with these settings"
 */
export function wireSettingsScreen(changed: () => void, apply: () => void): void {
  byId('map-settings').addEventListener('click', () => show('settings'));
  byId('settings-button').addEventListener('click', () => show('settings'));
  byId('settings-back').addEventListener('click', () => show(state.backTo === 'settings' ? 'open' : state.backTo));
  byId('settings-apply').addEventListener('click', apply);
  byId('settings-save').addEventListener('click', () => download('phasewise-settings.json', settingsFileText(state.settings, readGasConstants().gas), 'application/json'));
  byId('settings-reset').addEventListener('click', () => {
    state.settings = defaultSettings();
    writeGasConstants({});
    renderSettingsForm();
    changed();
  });
  byId<HTMLInputElement>('settings-input').addEventListener('change', async (e) => {
    const input = e.target as HTMLInputElement;
    const f = input.files?.[0];
    input.value = '';
    if (!f) return;
    try {
      const r = settingsFromFile(await f.text(), f.name);
      state.settings = r.settings;
      writeGasConstants(r.gas);
      renderSettingsForm();
      changed();
      if (r.ignoredFiles) fail(`${f.name}: the ${r.ignoredFiles} per-file pattern section(s) are for batch runs and were not applied here.`);
    } catch (err) {
      fail((err as Error).message);
    }
  });
}
