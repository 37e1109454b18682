// The readers hand valid UTF-8 to the line scanner as bytes, without decoding it. Two checks:
// 1. Utf8Stream refuses a chunk exactly when a fatal TextDecoder (WHATWG Encoding Standard, "UTF-8 decoder") throws
//    on it, and says where an unfinished last character starts;
// 2. reading a file as bytes gives the same samples, bit for bit, and the same report (notes included) as reading it
//    as decoded text: multi-byte characters cut by chunk borders, damage after the first MiB (also right after a
//    cut character), a character cut by the end of the file, a byte-order mark.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CHUNK_BYTES, readRecordingBytes, Utf8Stream, type ByteSource } from '../../src/ingest/bytes';
import { DEFAULT_INGEST } from '../../src/settings';
import type { SampleBlock } from '../../src/types';
import { concatBlocks } from './reference-reader';

function decoderVerdicts(chunks: Uint8Array[]): number {
  const d = new TextDecoder('utf-8', { fatal: true });
  for (let k = 0; k < chunks.length; k++) {
    try {
      d.decode(chunks[k], { stream: true });
    } catch {
      return k;
    }
  }
  return -1;
}

function streamVerdicts(chunks: Uint8Array[]): { failedAt: number; cuts: number[] } {
  const u = new Utf8Stream();
  const cuts: number[] = [];
  for (let k = 0; k < chunks.length; k++) {
    const c = u.check(chunks[k]!);
    if (c < 0) return { failedAt: k, cuts };
    cuts.push(c);
  }
  return { failedAt: -1, cuts };
}

/** bytes likely to form (in)valid UTF-8: ASCII, leads, continuations, the boundary bytes of the WHATWG table */
const byte = fc.oneof(
  fc.integer({ min: 0x20, max: 0x7e }),
  fc.integer({ min: 0x80, max: 0xbf }),
  fc.constantFrom(0xc0, 0xc1, 0xc2, 0xdf, 0xe0, 0xe1, 0xed, 0xee, 0xef, 0xf0, 0xf1, 0xf4, 0xf5, 0xff, 0x9f, 0xa0, 0x8f, 0x90),
);

describe('Utf8Stream', () => {
  it('fails on the same chunk as a fatal TextDecoder, for random bytes in random chunks', () => {
    fc.assert(
      fc.property(fc.array(fc.array(byte, { maxLength: 12 }), { minLength: 1, maxLength: 6 }), (parts) => {
        const chunks = parts.map((p) => Uint8Array.from(p));
        const { failedAt } = streamVerdicts(chunks);
        expect(failedAt).toBe(decoderVerdicts(chunks));
      }),
      { numRuns: 5000 },
    );
  });

  it('cuts valid text before an unfinished character, and the pieces decode to the same text', () => {
    const text = 'a€b😀c\u00e9' + 'x'.repeat(5) + '\u4e2d\u6587';
    const bytes = new TextEncoder().encode(text);
    for (let split = 0; split <= bytes.length; split++) {
      const u = new Utf8Stream();
      const c1 = u.check(bytes.subarray(0, split));
      expect(c1).toBeGreaterThanOrEqual(0);
      const carried = bytes.subarray(c1, split);
      const c2 = u.check(bytes.subarray(split));
      expect(c2).toBe(bytes.length - split);
      const d = new TextDecoder();
      const whole = d.decode(bytes.subarray(0, c1)) + d.decode(Uint8Array.from([...carried, ...bytes.subarray(split)]));
      expect(whole).toBe(text);
      expect(u.unfinished).toBe(false);
    }
  });
});

/** a recording with non-ASCII text in a comment column, as bytes */
function recording(rows: number): Uint8Array {
  const lines = ['time_s,flow_lps,co2_mmhg,note'];
  for (let i = 0; i < rows; i++) {
    const t = (i / 100).toFixed(2);
    const f = (0.5 * Math.sin(i / 40)).toFixed(4);
    const c = (20 + 18 * Math.sin(i / 40 + 1)).toFixed(2);
    lines.push(`${t},${f},${c},${i % 7 === 0 ? 'Ölbad – µ€ 😀 ok' : 'ok'}`);
  }
  return new TextEncoder().encode(lines.join('\n') + '\n');
}

async function read(bytes: Uint8Array, decodeAll: boolean) {
  const blocks: SampleBlock[] = [];
  const src: ByteSource = {
    name: 'x.csv',
    size: bytes.length,
    chunks: (async function* () {
      for (let o = 0; o < bytes.length; o += CHUNK_BYTES) yield bytes.subarray(o, o + CHUNK_BYTES);
    })(),
    lineAtByte: async (offset) => {
      let line = 1;
      for (let i = 0; i < offset && i < bytes.length; i++) if (bytes[i] === 10) line++;
      return line;
    },
    notTextHint: 'hint',
    decodeAll,
  };
  const report = await readRecordingBytes(src, DEFAULT_INGEST, 20, { onBlock: (b) => blocks.push(b) });
  return { samples: concatBlocks(blocks), report };
}

async function expectSameBothWays(bytes: Uint8Array) {
  const a = await read(bytes, false);
  const b = await read(bytes, true);
  expect(a.report).toEqual(b.report);
  for (const k of ['t', 'flow', 'co2'] as const) {
    const x = a.samples[k];
    const y = b.samples[k];
    expect(x.length).toBe(y.length);
    expect(x.every((v, i) => Object.is(v, y[i]))).toBe(true);
  }
  return a;
}

describe('bytes or decoded text: the same result', () => {
  const base = recording(150_000); // about 4 MB: several 1 MiB chunks, characters cut at their borders

  it('multi-byte characters across chunk borders, and a byte-order mark', async () => {
    const a = await expectSameBothWays(base);
    expect(a.report.rows_skipped).toBe(0);
    await expectSameBothWays(Uint8Array.from([0xef, 0xbb, 0xbf, ...base.subarray(0, 200_000)]));
  });

  it('damage after the first MiB, in a number and right after a character cut by a chunk border', async () => {
    const d1 = base.slice();
    d1[CHUNK_BYTES + 5000] = 0xff;
    const a = await expectSameBothWays(d1);
    expect(a.report.notes.at(-1)).toMatch(/^warning: 1 byte sequence\(s\) are not UTF-8 text/);
    // a 4-byte character cut by the second chunk border (F0 9F | 98 80), then damage later in that next chunk
    const border = 2 * CHUNK_BYTES;
    const d2 = Uint8Array.from([...base.subarray(0, border - 2), 0xf0, 0x9f, 0x98, 0x80, ...base.subarray(border - 2)]);
    d2[border + 100] = 0xc0;
    await expectSameBothWays(d2);
  });

  it('a character cut by the end of the file', async () => {
    const cut = Uint8Array.from([...base.subarray(0, CHUNK_BYTES + 1000), 0xe2, 0x82]);
    const a = await expectSameBothWays(cut);
    expect(a.report.notes.at(-1)).toMatch(/^warning: 1 byte sequence\(s\)/);
  });
});
