// The start screen's extras when the page is served by `phasewise view` (src/node/view-server.ts): the server marks
// the page with <meta name="phasewise-launch" content="launch.json">, which lists the bundled sample recordings and
// the recording given on the command line. They are fetched from the page's own loopback origin (the only place the
// page's policy lets it fetch from there); the development viewer has no marker and shows none of this.
import { byId, formatFileSize, h } from './dom';

interface Launch {
  samples: { name: string; url: string; bytes: number; description: string }[];
  /** `companions`: a WFDB header's signal files, opened together with it */
  open: { name: string; url: string; companions?: { name: string; url: string }[] } | null;
}

/** A recording served by the viewer's own server, as a File (the same path as a file the user picked). */
async function fetchRecording(url: string, name: string): Promise<File> {
  const r = await fetch(url);
  if (!r.ok) throw new Error(`${name}: the viewer's server answered ${r.status}`);
  return new File([await r.blob()], name);
}

/** Offers the samples on the start screen and opens the given recording, when the page was served by `phasewise view`. */
export async function startLaunch(open: (files: File[]) => void, fail: (e: unknown) => void): Promise<void> {
  const marker = document.querySelector<HTMLMetaElement>('meta[name="phasewise-launch"]');
  if (!marker) return;
  try {
    const r = await fetch(marker.content);
    if (!r.ok) return;
    const launch = (await r.json()) as Launch;
    const list = byId('samples');
    for (const s of launch.samples) {
      const button = h('button', { type: 'button', text: s.name, title: s.description });
      button.addEventListener('click', () => fetchRecording(s.url, s.name).then((f) => open([f]), fail));
      list.append(h('li', {}, [button, ` ${s.description} (${formatFileSize(s.bytes)})`]));
    }
    byId('samples-box').hidden = launch.samples.length === 0;
    if (launch.open) {
      const files = [launch.open, ...(launch.open.companions ?? [])];
      open(await Promise.all(files.map((f) => fetchRecording(f.url, f.name))));
    }
  } catch (e) {
    fail(e);
  }
}
