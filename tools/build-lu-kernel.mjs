// Builds the WebAssembly SIMD kernel of the dense LU's trailing update (core/numeric/lu.ts) and
// writes it, base64-encoded, into core/numeric/wasm/luKernel.generated.ts.
//   node tools/build-lu-kernel.mjs          (write)
//   node tools/build-lu-kernel.mjs --check  (exit 1 if the committed file differs)
// The text is generated here (register-blocked tiles written out) and assembled by wabt's
// wat2wasm, a development dependency; the output depends only on this script and that version.
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import wabtInit from 'wabt';

/**
 * The one operation of the blocked LU's three steps, on an n×n complex matrix at byte 0 of the
 * memory (row-major, interleaved re, im: element (i, j) at 16(i·n + j)):
 * update(n, r0, r1, q0, q1, c0, c1):  A[i][j] −= Σ_{q0 ≤ q < q1} A[i][q]·A[q][j]
 * for rows r0 ≤ i < r1 and columns c0 ≤ j < c1 (nothing when q1 ≤ q0). The rows q and the
 * columns q must not overlap the updated block (true for every call of lu.ts).
 * Tiles of MR rows × NR complex columns keep 2·MR·NR accumulators (f64x2: one complex each):
 * per panel step, Σ lr·u and Σ li·u; at the end  c −= Σ lr·u + swap(Σ li·u)·(−1, 1), which is
 * Σ (lr + j li)(ur + j ui) (the swap is linear, so it is applied once per tile).
 */
const MR = Number(process.env.LU_MR ?? 2);
const NR = Number(process.env.LU_NR ?? 2);

function tile(mr, nr) {
  const L = [];
  const acc = (r, c, part) => `$a${r}_${c}_${part}`;
  for (let r = 0; r < mr; r++)
    for (let c = 0; c < nr; c++)
      for (const p of ['r', 'i']) L.push(`(local.set ${acc(r, c, p)} (v128.const f64x2 0 0))`);
  // $la: address of A[i][j0]; $pu: address of A[j0][j]
  L.push('(local.set $la (i32.add (local.get $rowI) (i32.shl (local.get $q0) (i32.const 4))))');
  L.push(
    '(local.set $pu (i32.add (i32.mul (local.get $q0) (local.get $rb)) (i32.shl (local.get $j) (i32.const 4))))',
  );
  L.push('(local.set $q (local.get $q0))');
  L.push('(block $qd (loop $ql');
  for (let c = 0; c < nr; c++) L.push(`(local.set $u${c} (v128.load offset=${16 * c} (local.get $pu)))`);
  for (let r = 0; r < mr; r++)
    for (const [p, off] of [
      ['r', 0],
      ['i', 8],
    ]) {
      const row =
        r > 0 ? `(i32.add (local.get $la) (i32.mul (i32.const ${r}) (local.get $rb)))` : '(local.get $la)';
      L.push(`(local.set $s (v128.load64_splat offset=${off} ${row}))`);
      for (let c = 0; c < nr; c++)
        L.push(
          `(local.set ${acc(r, c, p)} (f64x2.add (local.get ${acc(r, c, p)}) (f64x2.mul (local.get $s) (local.get $u${c}))))`,
        );
    }
  L.push('(local.set $la (i32.add (local.get $la) (i32.const 16)))');
  L.push('(local.set $pu (i32.add (local.get $pu) (local.get $rb)))');
  L.push('(local.set $q (i32.add (local.get $q) (i32.const 1)))');
  L.push('(br_if $ql (i32.lt_u (local.get $q) (local.get $q1)))');
  L.push('))');
  for (let r = 0; r < mr; r++)
    for (let c = 0; c < nr; c++) {
      const addr = `(i32.add (i32.add (local.get $rowI) (i32.mul (i32.const ${r}) (local.get $rb))) (i32.shl (i32.add (local.get $j) (i32.const ${c})) (i32.const 4)))`;
      L.push(`(local.set $pc ${addr})`);
      L.push(
        `(v128.store (local.get $pc) (f64x2.sub (v128.load (local.get $pc)) (f64x2.add (local.get ${acc(r, c, 'r')}) (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get ${acc(r, c, 'i')}) (local.get ${acc(r, c, 'i')})) (v128.const f64x2 -1 1)))))`,
      );
    }
  return L.join('\n');
}

function columns(mr) {
  // j from j1 in steps of NR, then single columns
  return `(local.set $j (local.get $c0))
(block $cd (loop $cl
  (br_if $cd (i32.gt_u (i32.add (local.get $j) (i32.const ${NR})) (local.get $c1)))
  ${tile(mr, NR)}
  (local.set $j (i32.add (local.get $j) (i32.const ${NR})))
  (br $cl)))
(block $c1d (loop $c1l
  (br_if $c1d (i32.ge_u (local.get $j) (local.get $c1)))
  ${tile(mr, 1)}
  (local.set $j (i32.add (local.get $j) (i32.const 1)))
  (br $c1l)))`;
}

const locals = [];
for (let r = 0; r < MR; r++)
  for (let c = 0; c < NR; c++) for (const p of ['r', 'i']) locals.push(`(local $a${r}_${c}_${p} v128)`);
for (let c = 0; c < NR; c++) locals.push(`(local $u${c} v128)`);

const wat = `(module
(memory (export "memory") 1)
(func (export "update") (param $n i32) (param $r0 i32) (param $r1 i32) (param $q0 i32) (param $q1 i32) (param $c0 i32) (param $c1 i32)
(local $i i32) (local $j i32) (local $q i32) (local $rb i32) (local $rowI i32) (local $la i32) (local $pu i32) (local $pc i32) (local $s v128)
${locals.join(' ')}
(if (i32.ge_u (local.get $q0) (local.get $q1)) (then (return)))
(local.set $rb (i32.shl (local.get $n) (i32.const 4)))
(local.set $i (local.get $r0))
(block $rd (loop $rl
  (br_if $rd (i32.gt_u (i32.add (local.get $i) (i32.const ${MR})) (local.get $r1)))
  (local.set $rowI (i32.mul (local.get $i) (local.get $rb)))
  ${columns(MR)}
  (local.set $i (i32.add (local.get $i) (i32.const ${MR})))
  (br $rl)))
(block $r1d (loop $r1l
  (br_if $r1d (i32.ge_u (local.get $i) (local.get $r1)))
  (local.set $rowI (i32.mul (local.get $i) (local.get $rb)))
  ${columns(1)}
  (local.set $i (i32.add (local.get $i) (i32.const 1)))
  (br $r1l)))
))`;

const wabt = await wabtInit();
const mod = wabt.parseWat('lu-kernel.wat', wat, { simd: true });
mod.validate();
const { buffer } = mod.toBinary({ log: false, write_debug_names: false });
mod.destroy();
const b64 = Buffer.from(buffer).toString('base64');
const text = `// Generated by tools/build-lu-kernel.mjs (wabt ${JSON.parse(readFileSync(new URL('../node_modules/wabt/package.json', import.meta.url), 'utf8')).version}); do not edit.
// The WebAssembly SIMD trailing update of the dense LU (${buffer.length} bytes; tiles ${MR} × ${NR}).
export const LU_KERNEL_WASM_BASE64 =
  '${b64}';
`;
const out = fileURLToPath(new URL('../core/numeric/wasm/luKernel.generated.ts', import.meta.url));
if (process.argv.includes('--check')) {
  let old = '';
  try {
    old = readFileSync(out, 'utf8');
  } catch {
    /* missing */
  }
  if (old !== text) {
    process.stderr.write(`${out} is not what the build script makes; run node tools/build-lu-kernel.mjs\n`);
    process.exit(1);
  }
} else writeFileSync(out, text);
process.stdout.write(`${buffer.length} bytes\n`);
