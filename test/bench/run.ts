/**
 * Field-solver benchmark (not a timed test): `npx tsx test/bench/run.ts`.
 *
 *  1. one full evaluation of a 200-unknown antenna over lossy ground: fill, solve, the upper
 *     half-space pattern at 2° steps (8280 directions), the radiated-power integration and the
 *     peak search (target ≤ 60 ms);
 *  2. a 31-point feed-impedance sweep of a 100-unknown antenna (target ≤ 300 ms), direct and
 *     interpolated (an anchor every third point);
 *  3. LU factorisation against LAPACK through numpy/scipy, one thread, at n = 100, 200, 400 (the
 *     WebAssembly kernel Node offers: Node 20 has relaxed SIMD's multiply-add, which Electron and
 *     Chromium use, only with `node --experimental-wasm-relaxed-simd --import tsx test/bench/run.ts`);
 *  4. memory of the solve: one complex matrix, factored in place, plus the pivot rows;
 *  5. then test/bench/halfspace.ts (the exact ground), test/bench/phases.ts (fill, LU and
 *     pattern of one evaluation, timed apart) and test/bench/plan.ts (cold plan, re-plan, 40
 *     supports; left out with `--no-plan`, shortened with `--quick`), each in its own process.
 * Items 1 and 2 use the reflection-coefficient ground (comparable with earlier runs); the exact
 * ground's figures are item 5's.
 * Medians of several runs after warm-up, wall clock and process CPU time (the CPU time is the
 * fairer figure on a machine shared with other work; the load average is printed). Prints plain
 * text; `--json` prints one JSON object: the headline figures first (explained in README.md,
 * "Benchmarks"), then each part's details.
 */
import { spawnSync } from 'node:child_process';
import { availableParallelism, loadavg } from 'node:os';
import { evaluateAntenna } from '../../core/em/evaluate.ts';
import { sweepImpedance } from '../../core/em/sweep.ts';
import { luFactor, luKernelKind, useLuKernel } from '../../core/numeric/lu.ts';
import { array200, halfSquare100 } from './models.ts';

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Wall-clock times (ms) of `runs` calls after `warm` warm-up calls; CPU times (ms) in `cpu`. */
function time(fn: () => void, warm: number, runs: number, cpu: number[] = []): number[] {
  for (let i = 0; i < warm; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    fn();
    out.push(performance.now() - t0);
    const c1 = process.cpuUsage(c0);
    cpu.push((c1.user + c1.system) / 1000);
  }
  return out;
}

const lines: string[] = [];
const minOf = (xs: number[]): number => Math.min(...xs);
const json: Record<string, unknown> = {};
const say = (s: string) => lines.push(s);

// 1. full evaluation
{
  let unknowns = 0;
  const cpu: number[] = [];
  const t = time(
    () => {
      unknowns = evaluateAntenna(array200, { frequenciesHz: [7.1e6], groundModel: 'approximate' }).unknowns;
    },
    3,
    11,
    cpu,
  );
  json.fullEvaluation200 = { unknowns, medianMs: median(t), cpuMedianMs: median(cpu), runsMs: t };
  say(
    `full evaluation, ${unknowns} unknowns over lossy ground (approximate model), 2° upper half-space pattern: median ${median(t).toFixed(1)} ms (min ${minOf(t).toFixed(1)}, CPU-time median ${median(cpu).toFixed(1)}; target 60 ms)`,
  );
}
// 2. sweep
{
  const freqs = Array.from({ length: 31 }, (_, i) => 3.5e6 + i * 0.01e6);
  let unknowns = 0;
  const cpu: number[] = [];
  const t = time(
    () => {
      sweepImpedance(halfSquare100, freqs, { groundModel: 'approximate' });
    },
    2,
    7,
    cpu,
  );
  unknowns = evaluateAntenna(halfSquare100, {
    frequenciesHz: [3.6e6],
    pattern: { elevationsDeg: [], azimuthsDeg: [] },
  }).unknowns;
  let err = 0;
  const ti = time(
    () => {
      err =
        sweepImpedance(halfSquare100, freqs, { anchorEvery: 3, groundModel: 'approximate' })
          .interpolationError ?? 0;
    },
    2,
    7,
  );
  json.sweep31x100 = {
    unknowns,
    medianMs: median(t),
    interpolatedMedianMs: median(ti),
    interpolationError: err,
  };
  say(
    `31-point sweep, ${unknowns} unknowns (approximate ground): median ${median(t).toFixed(1)} ms (min ${minOf(t).toFixed(1)}, CPU-time median ${median(cpu).toFixed(1)}; target 300 ms); interpolated (anchor every 3rd point): ${median(ti).toFixed(1)} ms, checked error ${(100 * err).toFixed(3)} %`,
  );
}
// 3. LU against LAPACK
{
  const sizes = [100, 200, 400];
  const ours: Record<number, number> = {};
  const oursCpu: Record<number, number> = {};
  const tsOnly: Record<number, number> = {};
  const kernel = useLuKernel(true);
  const kernelKind = luKernelKind();
  for (const n of sizes) {
    let s = 12345;
    const a0 = new Float64Array(2 * n * n).map(() => {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      return s / 4294967296 - 0.5;
    });
    const a = new Float64Array(a0.length);
    const piv = new Int32Array(n);
    const cpu: number[] = [];
    const t = time(
      () => {
        a.set(a0);
        luFactor(n, a, piv);
      },
      3,
      n >= 400 ? 9 : 15,
      cpu,
    );
    ours[n] = median(t);
    oursCpu[n] = median(cpu);
    // the TypeScript path alone (no WebAssembly kernel), for what the kernel buys
    useLuKernel(false);
    tsOnly[n] = median(
      time(
        () => {
          a.set(a0);
          luFactor(n, a, piv);
        },
        2,
        n >= 400 ? 5 : 9,
      ),
    );
    useLuKernel(true);
  }
  const py = `
import time, sys
import numpy as np
try:
    from scipy.linalg import lu_factor as f
    how = 'scipy.linalg.lu_factor (LAPACK zgetrf)'
    run = lambda a: f(a, overwrite_a=True, check_finite=False)
except Exception:
    how = 'numpy.linalg.solve (LAPACK zgesv)'
    run = lambda a: np.linalg.solve(a, np.ones(a.shape[0]))
rng = np.random.default_rng(1)
out = {}
for n in (100, 200, 400):
    a0 = (rng.random((n, n)) - 0.5) + 1j * (rng.random((n, n)) - 0.5)
    ts = []
    for i in range(3 + 15):
        a = np.array(a0, order='F')
        t0 = time.perf_counter(); run(a); t1 = time.perf_counter()
        if i >= 3: ts.append((t1 - t0) * 1000)
    ts.sort(); out[n] = ts[len(ts) // 2]
print(how)
print(' '.join(f'{n}:{out[n]}' for n in out))
`;
  const env = {
    ...process.env,
    OPENBLAS_NUM_THREADS: '1',
    OMP_NUM_THREADS: '1',
    MKL_NUM_THREADS: '1',
    VECLIB_MAXIMUM_THREADS: '1',
  };
  let lapack: Record<number, number> | null = null;
  let how = '';
  for (const exe of ['python3', '/usr/bin/python3']) {
    const r = spawnSync(exe, ['-c', py], { env, encoding: 'utf8', timeout: 120_000 });
    if (r.status === 0) {
      const [h, nums] = r.stdout.trim().split('\n');
      how = `${h} via ${exe}`;
      lapack = Object.fromEntries(nums.split(' ').map((kv) => kv.split(':').map(Number)));
      break;
    }
  }
  json.lu = {
    oursMs: ours,
    oursCpuMs: oursCpu,
    wasmKernel: kernel,
    wasmKernelKind: kernelKind,
    typeScriptOnlyMs: tsOnly,
    lapackMs: lapack,
    lapack: how || null,
  };
  for (const n of sizes) {
    const flops = (8 / 3) * n ** 3; // complex LU flop count of LAPACK Working Note 41 (zgetrf)
    const gf = flops / (ours[n] * 1e6);
    if (lapack)
      say(
        `LU n = ${n}: ours ${ours[n].toFixed(2)} ms (CPU ${oursCpu[n].toFixed(2)} ms, ${gf.toFixed(1)} GFlop/s; TypeScript path alone ${tsOnly[n].toFixed(2)} ms), LAPACK ${lapack[n].toFixed(2)} ms, ratio ${(ours[n] / lapack[n]).toFixed(1)}×`,
      );
    else say(`LU n = ${n}: ours ${ours[n].toFixed(2)} ms (${gf.toFixed(1)} GFlop/s)`);
  }
  say(
    kernelKind === 'fused'
      ? 'LU kernel: WebAssembly SIMD with relaxed SIMD multiply-add (as in Electron and Chromium)'
      : `LU kernel: ${kernel ? 'WebAssembly SIMD, multiply and add' : 'none (TypeScript)'}; Electron and Chromium use the multiply-add kernel, measured here with \`node --experimental-wasm-relaxed-simd --import tsx test/bench/run.ts\``,
  );
  say(
    lapack
      ? `LAPACK reference: ${how}, one thread`
      : 'LAPACK comparison skipped: no python3 with numpy found (install python3-numpy to measure)',
  );
}
// 4. memory
{
  const n = 200;
  const bytes = 2 * n * n * 8 + 4 * n;
  json.memory = { unknowns: n, matrixAndFactorsBytes: bytes };
  say(
    `memory, ${n} unknowns: one complex matrix factored in place + pivots = ${(bytes / 1024).toFixed(0)} KiB; no object per element`,
  );
}

say(
  `load average during the run (1, 5, 15 min): ${loadavg()
    .map((l) => l.toFixed(2))
    .join(', ')} on this machine's cores`,
);
json.loadAverage = loadavg();

const asJson = process.argv.includes('--json');
const quick = process.argv.includes('--quick');
if (!asJson) process.stdout.write(lines.join('\n') + '\n');

/** Runs another benchmark script in its own process; its JSON (with --json) or null. */
function child(script: string, extra: string[] = []): Record<string, unknown> | null {
  const args = ['--import', 'tsx', script, ...extra, ...(asJson ? ['--json'] : [])];
  const r = spawnSync(process.execPath, args, {
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'inherit'],
    maxBuffer: 64 * 1024 * 1024,
  });
  if (r.status !== 0) {
    process.stderr.write(`${script} failed; run \`npx tsx ${script}\` alone\n`);
    return null;
  }
  if (!asJson) {
    process.stdout.write(`\n${script}:\n${r.stdout}`);
    return null;
  }
  return JSON.parse(r.stdout) as Record<string, unknown>;
}

// 5. the exact ground (tables, 200-unknown evaluation, sweep); 6. the phases of one evaluation;
// 7. planning (cold, re-plan, 40 supports): each its own script, own process
const exact = child('test/bench/halfspace.ts');
const phases = child('test/bench/phases.ts');
const plan = process.argv.includes('--no-plan')
  ? null
  : child('test/bench/plan.ts', quick ? ['--quick'] : []);

if (asJson) {
  type Timed = { ms: number };
  const lu = json.lu as { oursMs: Record<number, number>; lapackMs: Record<number, number> | null };
  const ratio = (n: number): number | null => (lu.lapackMs ? lu.oursMs[n] / lu.lapackMs[n] : null);
  const ev = json.fullEvaluation200 as { medianMs: number };
  const ex = exact?.fullEvaluation200 as { cachedMedian: Timed; first: Timed } | undefined;
  const ph = phases as Record<string, { fillMs: number; luMs: number; patternMs: number }> | null;
  const summary = {
    evaluation200Ms: ev.medianMs,
    evaluation200ExactMs: ex?.cachedMedian.ms ?? null,
    evaluation200ExactFirstMs: ex?.first.ms ?? null,
    fill200Ms: ph?.approximate.fillMs ?? null,
    fill200ExactMs: ph?.exact.fillMs ?? null,
    lu200Ms: lu.oursMs[200],
    pattern200Ms: ph?.approximate.patternMs ?? null,
    luRatio200: ratio(200),
    luRatio400: ratio(400),
    coldPlanDemoS: plan?.coldPlanDemoS ?? null,
    replanMedianS: plan?.replanMedianS ?? null,
    livePreviewMedianS: plan?.livePreviewMedianS ?? null,
    replanAfterRestMedianS: plan?.replanAfterRestMedianS ?? null,
    plan40SupportsS: plan?.plan40SupportsS ?? null,
    plan500SupportsS: plan?.plan500SupportsS ?? null,
    loadAverage: loadavg(),
    cores: availableParallelism(),
  };
  const out = { ...summary, solver: json, exactGround: exact, phases, plan };
  process.stdout.write(JSON.stringify(out, null, 2) + '\n');
}
