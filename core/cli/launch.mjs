// `npm run -s cli -- …`: runs the command line from its bundle (bundle.mjs; built at first use and
// after any change to its sources, about a second once), so that a command does not pay for a
// TypeScript loader at every start. Without esbuild it runs the sources through tsx.
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { freshBundle, ROOT } from './bundle.mjs';

const bundle = freshBundle('core/cli/run.ts', join(ROOT, '.cache', 'cli'), 'run');
if (bundle) await import(pathToFileURL(bundle).href);
else {
  const { register } = await import('tsx/esm/api');
  register();
  await import(pathToFileURL(join(ROOT, 'core', 'cli', 'run.ts')).href);
}
