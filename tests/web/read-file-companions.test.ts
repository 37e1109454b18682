// The viewer's WFDB preview: a file chosen together with a WFDB header that the header does not name as a signal
// file is not read, and the mapping step's notes say so (nothing chosen is silently ignored).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { defaultSettings } from '../../src/settings';
import { readSignalsHead } from '../../web/read-file';

const DIR = join(__dirname, '..', 'fixtures', 'wfdb');
const file = (name: string) => new File([readFileSync(join(DIR, name))], name);

describe('viewer: files chosen with a WFDB header', () => {
  it('a chosen file the header does not name is listed in the notes as not read', async () => {
    const { layout } = await readSignalsHead(file('f212.hea'), [file('f212_flow.dat'), file('f212_co2.dat'), file('f16.dat')], defaultSettings().ingest, 20);
    const note = layout.notes.find((n) => n.includes('f16.dat'));
    expect(note).toBeDefined();
    expect(note).toContain('not read');
    expect(layout.notes.some((n) => n.includes('f212_flow.dat') && n.includes('not read'))).toBe(false);
  });
});
