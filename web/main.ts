// Entry point of the review page. The page forbids eval (CSP script-src 'self'), and zod probes for it with
// `new Function` as soon as an object schema is built (src/settings-file.ts builds them when it loads); the probe is
// caught, but the browser still reports a CSP violation. So zod's jitless mode is switched on first, and the rest
// of the page is loaded only afterwards.
import { z } from 'zod';

z.config({ jitless: true });
import('./app')
  .then((app) => app.start())
  .catch((e: unknown) => {
    document.body.dataset.state = 'error';
    document.body.prepend(`The viewer could not start: ${String((e as Error)?.message ?? e)}`);
  });
