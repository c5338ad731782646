// Builds the WebAssembly SIMD kernel of the dense LU (core/numeric/lu.ts: its panel step and its
// block update) and writes it, base64-encoded, into core/numeric/wasm/luKernel.generated.ts.
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

function tile(mr, nr, fma) {
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
          fma
            ? `(local.set ${acc(r, c, p)} (f64x2.relaxed_madd (local.get $s) (local.get $u${c}) (local.get ${acc(r, c, p)})))`
            : `(local.set ${acc(r, c, p)} (f64x2.add (local.get ${acc(r, c, p)}) (f64x2.mul (local.get $s) (local.get $u${c}))))`,
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

function columns(mr, fma) {
  // j from j1 in steps of NR, then single columns
  return `(local.set $j (local.get $c0))
(block $cd (loop $cl
  (br_if $cd (i32.gt_u (i32.add (local.get $j) (i32.const ${NR})) (local.get $c1)))
  ${tile(mr, NR, fma)}
  (local.set $j (i32.add (local.get $j) (i32.const ${NR})))
  (br $cl)))
(block $c1d (loop $c1l
  (br_if $c1d (i32.ge_u (local.get $j) (local.get $c1)))
  ${tile(mr, 1, fma)}
  (local.set $j (i32.add (local.get $j) (i32.const 1)))
  (br $c1l)))`;
}

const locals = [];
for (let r = 0; r < MR; r++)
  for (let c = 0; c < NR; c++) for (const p of ['r', 'i']) locals.push(`(local $a${r}_${c}_${p} v128)`);
for (let c = 0; c < NR; c++) locals.push(`(local $u${c} v128)`);

/**
 * The panel step (unblocked getf2 on columns j0 ≤ k < j1, all rows k ≤ i < n) in one call:
 * panel(n, j0, j1, pv) → −1, or the column whose pivot is exactly zero. For each column k: the
 * row p ≥ k of largest |A[p][k]|² (the first one on ties), stored as i32 at pv + 4k; rows k and p
 * swapped across the whole row; then each row i > k scaled, l = A[i][k]/A[k][k] (as the product
 * with the reciprocal, in the same order of operations as lu.ts), and A[i][j] −= l·A[k][j] for
 * k < j < j1 on f64x2 lanes (one complex each; the same roundings as the TypeScript path).
 */
const panel = `(func (export "panel") (param $n i32) (param $j0 i32) (param $j1 i32) (param $pv i32) (result i32)
(local $rb i32) (local $k i32) (local $i i32) (local $p i32) (local $a i32) (local $rk i32) (local $rp i32)
(local $ri i32) (local $off i32) (local $jb i32) (local $je i32)
(local $best f64) (local $m f64) (local $re f64) (local $im f64) (local $ir f64) (local $ii f64) (local $d f64)
(local $lr f64) (local $li f64) (local $t v128) (local $u v128) (local $vlr v128) (local $vli v128)
(local.set $rb (i32.shl (local.get $n) (i32.const 4)))
(local.set $je (i32.shl (local.get $j1) (i32.const 4)))
(local.set $k (local.get $j0))
(block $kd (loop $kl
  (br_if $kd (i32.ge_u (local.get $k) (local.get $j1)))
  (local.set $rk (i32.mul (local.get $k) (local.get $rb)))
  (local.set $a (i32.add (local.get $rk) (i32.shl (local.get $k) (i32.const 4))))
  (local.set $i (local.get $k))
  (local.set $p (local.get $k))
  (local.set $best (f64.const -1))
  (block $sd (loop $sl
    (br_if $sd (i32.ge_u (local.get $i) (local.get $n)))
    (local.set $re (f64.load (local.get $a)))
    (local.set $im (f64.load offset=8 (local.get $a)))
    (local.set $m (f64.add (f64.mul (local.get $re) (local.get $re)) (f64.mul (local.get $im) (local.get $im))))
    (if (f64.gt (local.get $m) (local.get $best)) (then (local.set $best (local.get $m)) (local.set $p (local.get $i))))
    (local.set $a (i32.add (local.get $a) (local.get $rb)))
    (local.set $i (i32.add (local.get $i) (i32.const 1)))
    (br $sl)))
  (if (i32.eqz (f64.gt (local.get $best) (f64.const 0))) (then (return (local.get $k))))
  (i32.store (i32.add (local.get $pv) (i32.shl (local.get $k) (i32.const 2))) (local.get $p))
  (if (i32.ne (local.get $p) (local.get $k)) (then
    (local.set $rp (i32.mul (local.get $p) (local.get $rb)))
    (local.set $off (i32.const 0))
    (block $wd (loop $wl
      (br_if $wd (i32.ge_u (local.get $off) (local.get $rb)))
      (local.set $t (v128.load (i32.add (local.get $rk) (local.get $off))))
      (v128.store (i32.add (local.get $rk) (local.get $off)) (v128.load (i32.add (local.get $rp) (local.get $off))))
      (v128.store (i32.add (local.get $rp) (local.get $off)) (local.get $t))
      (local.set $off (i32.add (local.get $off) (i32.const 16)))
      (br $wl)))))
  (local.set $a (i32.add (local.get $rk) (i32.shl (local.get $k) (i32.const 4))))
  (local.set $re (f64.load (local.get $a)))
  (local.set $im (f64.load offset=8 (local.get $a)))
  (local.set $d (f64.add (f64.mul (local.get $re) (local.get $re)) (f64.mul (local.get $im) (local.get $im))))
  (local.set $ir (f64.div (local.get $re) (local.get $d)))
  (local.set $ii (f64.div (f64.neg (local.get $im)) (local.get $d)))
  (local.set $jb (i32.shl (i32.add (local.get $k) (i32.const 1)) (i32.const 4)))
  (local.set $i (i32.add (local.get $k) (i32.const 1)))
  (local.set $ri (i32.add (local.get $rk) (local.get $rb)))
  (block $rd (loop $rl
    (br_if $rd (i32.ge_u (local.get $i) (local.get $n)))
    (local.set $a (i32.add (local.get $ri) (i32.shl (local.get $k) (i32.const 4))))
    (local.set $re (f64.load (local.get $a)))
    (local.set $im (f64.load offset=8 (local.get $a)))
    (local.set $lr (f64.sub (f64.mul (local.get $re) (local.get $ir)) (f64.mul (local.get $im) (local.get $ii))))
    (local.set $li (f64.add (f64.mul (local.get $re) (local.get $ii)) (f64.mul (local.get $im) (local.get $ir))))
    (f64.store (local.get $a) (local.get $lr))
    (f64.store offset=8 (local.get $a) (local.get $li))
    (local.set $vlr (f64x2.splat (local.get $lr)))
    (local.set $vli (f64x2.splat (local.get $li)))
    (local.set $off (local.get $jb))
    (block $cd (loop $cl
      (br_if $cd (i32.ge_u (local.get $off) (local.get $je)))
      (local.set $u (v128.load (i32.add (local.get $rk) (local.get $off))))
      (local.set $a (i32.add (local.get $ri) (local.get $off)))
      (v128.store (local.get $a) (f64x2.sub (v128.load (local.get $a)) (f64x2.add (f64x2.mul (local.get $vlr) (local.get $u)) (f64x2.mul (f64x2.mul (local.get $vli) (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $u) (local.get $u))) (v128.const f64x2 -1 1)))))
      (local.set $off (i32.add (local.get $off) (i32.const 16)))
      (br $cl)))
    (local.set $ri (i32.add (local.get $ri) (local.get $rb)))
    (local.set $i (i32.add (local.get $i) (i32.const 1)))
    (br $rl)))
  (local.set $k (i32.add (local.get $k) (i32.const 1)))
  (br $kl)))
(i32.const -1))`;

const wat = (fma) => `(module
(memory (export "memory") 1)
${panel}
(func (export "update") (param $n i32) (param $r0 i32) (param $r1 i32) (param $q0 i32) (param $q1 i32) (param $c0 i32) (param $c1 i32)
(local $i i32) (local $j i32) (local $q i32) (local $rb i32) (local $rowI i32) (local $la i32) (local $pu i32) (local $pc i32) (local $s v128)
${locals.join(' ')}
(if (i32.ge_u (local.get $q0) (local.get $q1)) (then (return)))
(local.set $rb (i32.shl (local.get $n) (i32.const 4)))
(local.set $i (local.get $r0))
(block $rd (loop $rl
  (br_if $rd (i32.gt_u (i32.add (local.get $i) (i32.const ${MR})) (local.get $r1)))
  (local.set $rowI (i32.mul (local.get $i) (local.get $rb)))
  ${columns(MR, fma)}
  (local.set $i (i32.add (local.get $i) (i32.const ${MR})))
  (br $rl)))
(block $r1d (loop $r1l
  (br_if $r1d (i32.ge_u (local.get $i) (local.get $r1)))
  (local.set $rowI (i32.mul (local.get $i) (local.get $rb)))
  ${columns(1, fma)}
  (local.set $i (i32.add (local.get $i) (i32.const 1)))
  (br $r1l)))
))`;

const wabt = await wabtInit();
/** The module's bytes; with `fma` the accumulations use relaxed SIMD's fused multiply-add. */
function assemble(fma) {
  const mod = wabt.parseWat('lu-kernel.wat', wat(fma), { simd: true, relaxed_simd: fma });
  mod.validate();
  const { buffer } = mod.toBinary({ log: false, write_debug_names: false });
  mod.destroy();
  return Buffer.from(buffer);
}
const plain = assemble(false);
const fused = assemble(true);
const text = `// Generated by tools/build-lu-kernel.mjs (wabt ${JSON.parse(readFileSync(new URL('../node_modules/wabt/package.json', import.meta.url), 'utf8')).version}); do not edit.
// The WebAssembly SIMD panel step and block update of the dense LU (tiles ${MR} × ${NR}): with
// f64x2 multiply and add (${plain.length} bytes), and with relaxed SIMD's f64x2 multiply-add in the
// block update (${fused.length} bytes; used where the engine validates it).
export const LU_KERNEL_WASM_BASE64 =
  '${plain.toString('base64')}';
export const LU_KERNEL_FMA_WASM_BASE64 =
  '${fused.toString('base64')}';
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
process.stdout.write(`${plain.length} and ${fused.length} bytes\n`);
