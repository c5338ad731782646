// `npm run test:property`: the property tests with 10 000 cases each (a few hundred in `npm test`).
import { spawnSync } from 'node:child_process';
const r = spawnSync('npx', ['vitest', 'run', '-t', 'property'], {
  stdio: 'inherit',
  env: { ...process.env, YARDWIRE_PROPERTY_RUNS: process.env.YARDWIRE_PROPERTY_RUNS ?? '10000' },
});
process.exit(r.status ?? 1);
