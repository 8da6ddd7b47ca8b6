// Development-time generator of the WebAssembly SIMD kernels wasm/kernels.wasm. Run
// `node test/bench/generateWasmKernels.mjs` after changing the real-form convention
// (src/engine/realForm.ts) or the JS kernels' arithmetic (test/bench/generateUnrolledKernels.mjs);
// the output is committed, and test/engine/wasmKernels.test.ts fails when it differs from what
// this script produces. `--wat` prints the WebAssembly text instead of writing the binary.
//
// The kernels do the SAME floating-point operations in the SAME order as the generated JS
// kernels src/engine/kernelReal1.ts / kernelReal2.ts: one v128 holds one complex entry
// (re, im) and f64x2 add/sub/mul round each lane exactly as the scalar JS operation does (no
// fused multiply-add), so the two kernel families give bit-for-bit identical results. Mixed
// lanes (re of one value with im of another) are formed by shuffles, and a − b is written as
// a + (−b) only where IEEE 754 defines the two as the same operation.
//
// Memory (imported, shared): every pointer argument is a byte address. ρ is laid out as in
// src/engine/layout.ts; M' is the row-major real-form matrix of src/engine/realForm.ts (f64).
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import wabtInit from 'wabt';

const root = fileURLToPath(new URL('../../', import.meta.url));
/** Where the binary goes (WASM_OUT overrides it, e.g. for the regeneration test). */
const outFile = process.env.WASM_OUT ?? root + 'wasm/kernels.wasm';

const get = (x) => `(local.get $${x})`;
// shuffles of two f64x2 values a, b: [a.hi, b.lo] and the lane swap [a.hi, a.lo]
const HI_LO = 'i8x16.shuffle 8 9 10 11 12 13 14 15 16 17 18 19 20 21 22 23';
// [a.lo, b.hi]: a lane blend
const LO_HI = 'i8x16.shuffle 0 1 2 3 4 5 6 7 24 25 26 27 28 29 30 31';
const swap = (x) => `(i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 ${x} ${x})`;
// sign bit of lane 1 (im): xor with it negates that lane exactly (as JS unary minus)
const SIGN_IM = '(v128.const i64x2 0 0x8000000000000000)';
/** Byte offset in a part's scratch of the sign mask SIGN_IM (real2's mirrored writes load it once per block). */
const SIGN_SLOT = 1024;
/**
 * Byte offset in a part's scratch of the matrix, each entry splatted into a v128 at the call's
 * start: a plain v128.load with a constant offset is one instruction, where V8 computes the
 * address of every v128.load64_splat separately (and hoists and spills those addresses).
 */
const MAT_SPLATS = 2048;
/** Scratch bytes a thread part needs: MAT_SPLATS plus 256 splatted entries (src/engine/wasmKernels.ts: SCRATCH_BYTES_PER_PART). */
const SCRATCH_BYTES = MAT_SPLATS + 256 * 16;

/** Copies the size × size matrix at $mat into the scratch as splatted v128 entries. */
function splatMatrix(size) {
  return `(local.set $si (i32.const 0))
    (loop $splat
      (v128.store offset=${MAT_SPLATS} (i32.add (local.get $scratch) (i32.shl (local.get $si) (i32.const 4)))
        (v128.load64_splat (i32.add (local.get $mat) (i32.shl (local.get $si) (i32.const 3)))))
      (local.set $si (i32.add (local.get $si) (i32.const 1)))
      (br_if $splat (i32.lt_u (local.get $si) (i32.const ${size * size}))))`;
}
/** Coordinates J per step of the 2-qubit product loop (16 must be a multiple; measured on the bench machine with 1, 2 and 4: 1 was fastest). */
const TERMS_PER_STEP = 1;

/** A straight-line body under construction: v128 locals and their assignments. */
class Body {
  constructor() {
    this.locals = new Set();
    this.lines = [];
  }
  set(name, expr) {
    this.locals.add(name);
    this.lines.push(`(local.set $${name} ${expr})`);
    return name;
  }
  emit(line) {
    this.lines.push(line);
  }
}

/**
 * Forward per-factor transform (p00, p01, p10, p11) → (u0, u1, u2, u3) of the JS generator:
 * u0 = p00, u1 = p11, u2 = p01 + p10, u3 = (p10i − p01i, p01r − p10r).
 */
function forward(b, out, p00, p01, p10, p11) {
  b.set(out[2], `(f64x2.add ${get(p01)} ${get(p10)})`);
  b.set(out[3], `(f64x2.sub (${HI_LO} ${get(p10)} ${get(p01)}) (${HI_LO} ${get(p01)} ${get(p10)}))`);
  return [p00, p11, out[2], out[3]];
}

/**
 * Inverse per-factor transform of the JS generator: p00 = w0, p11 = w1,
 * p01 = (w2r + w3i, w2i − w3r), p10 = (w2r − w3i, w2i + w3r): the sum and the difference of w2
 * and the swapped w3, then their lanes blended (the very additions and subtractions of the JS
 * kernel, and no sign constant to materialise).
 */
function inverse(b, w, names) {
  const [n00, n01, n10, n11] = names;
  const plus = b.set(`${n01}_plus`, `(f64x2.add ${get(w[2])} ${swap(get(w[3]))})`);
  const minus = b.set(`${n01}_minus`, `(f64x2.sub ${get(w[2])} ${swap(get(w[3]))})`);
  b.set(n01, `(${LO_HI} ${get(plus)} ${get(minus)})`);
  b.set(n10, `(${LO_HI} ${get(minus)} ${get(plus)})`);
  return { [n00]: w[0], [n11]: w[1], [n01]: n01, [n10]: n10 };
}

/** Local declarations of a body plus the fixed i32 locals. */
function declare(i32s, body) {
  return [...i32s.map((x) => `(local $${x} i32)`), ...[...body.locals].map((x) => `(local $${x} v128)`)].join(' ');
}

/**
 * 1-qubit block code for blocks with suffixes `sfx` (p00_s … p11_s are their byte addresses):
 * loads, coordinates, products (each matrix entry loaded once for all the blocks; each output
 * a left-to-right chain), writes.
 */
function real1Blocks(tp, sfx) {
  const b = new Body();
  const u = {};
  for (const s of sfx) {
    for (const e of ['00', '01', '10', '11']) b.set(`x${e}${s}`, `(v128.load ${get(`p${e}${s}`)})`);
    u[s] = forward(b, [`u0${s}`, `u1${s}`, `u2${s}`, `u3${s}`], `x00${s}`, `x01${s}`, `x10${s}`, `x11${s}`);
  }
  for (const i of tp ? [0, 2, 3] : [0, 1, 2, 3]) {
    for (let j = 0; j < 4; j++) {
      b.set('mij', `(v128.load offset=${MAT_SPLATS + 16 * (4 * i + j)} (local.get $scratch))`);
      for (const s of sfx) {
        const prod = `(f64x2.mul ${get('mij')} ${get(u[s][j])})`;
        b.set(`y${i}${s}`, j === 0 ? prod : `(f64x2.add ${get(`y${i}${s}`)} ${prod})`);
      }
    }
  }
  for (const s of sfx) {
    // trace-preserving: y1 = (x00 + x11) − y0, as in the JS kernel
    if (tp) b.set(`y1${s}`, `(f64x2.sub (f64x2.add ${get(`x00${s}`)} ${get(`x11${s}`)}) ${get(`y0${s}`)})`);
    const z = inverse(b, [`y0${s}`, `y1${s}`, `y2${s}`, `y3${s}`], [`z00${s}`, `z01${s}`, `z10${s}`, `z11${s}`]);
    for (const e of ['00', '01', '10', '11']) b.emit(`(v128.store ${get(`p${e}${s}`)} ${get(z[`z${e}${s}`])})`);
  }
  return b;
}

/**
 * Smallest run of consecutive rest columns (m = 2^(n−1−q)) the 1-qubit kernels walk with plain
 * pointer steps; shorter runs take the bit-arithmetic step to the next rest column. Measured on the
 * bench machine (CPU time, 10 qubits): runs of m ≥ 4 columns 12–20% faster, m = 2 even, m = 1 13% slower.
 */
const REAL1_RUN_MIN = 4;

/** The 1-qubit kernels: block rows [start, end) of the rest rows (target bit zero), one block per step. */
function real1(tp) {
  const one = real1Blocks(tp, ['A']);
  const i32s = ['si', 'D', 'm', 'rowBytes', 'idx', 'r', 'b0', 'b1', 'c', 'mb', 'runEnd', 'p00A', 'p01A', 'p10A', 'p11A'];
  return `
  ;; rho -> Phi(rho) on qubit q, real-form M' (4 x 4 f64) at mat; rest rows [start, end); scratch: SCRATCH_BYTES
  (func (export "${tp ? 'real1tp' : 'real1'}") (param $rho i32) (param $n i32) (param $q i32) (param $mat i32) (param $scratch i32) (param $start i32) (param $end i32)
    ${declare(i32s, one)}
    (local.set $D (i32.shl (i32.const 1) (local.get $n)))
    (local.set $m (i32.shl (i32.const 1) (i32.sub (i32.sub (local.get $n) (i32.const 1)) (local.get $q))))
    (local.set $rowBytes (i32.shl (local.get $D) (i32.const 4)))
    (local.set $mb (i32.shl (local.get $m) (i32.const 4)))
    ${splatMatrix(4)}
    (local.set $idx (local.get $start))
    (block $rows_done
      (loop $rows
        (br_if $rows_done (i32.ge_u (local.get $idx) (local.get $end)))
        ;; the idx-th rest row: a zero inserted at the target bit
        (local.set $r (i32.or
          (i32.shl (i32.and (local.get $idx) (i32.xor (i32.sub (local.get $m) (i32.const 1)) (i32.const -1))) (i32.const 1))
          (i32.and (local.get $idx) (i32.sub (local.get $m) (i32.const 1)))))
        (local.set $b0 (i32.add (local.get $rho) (i32.mul (local.get $r) (local.get $rowBytes))))
        (local.set $b1 (i32.add (local.get $b0) (i32.mul (local.get $m) (local.get $rowBytes))))
        (local.set $c (i32.const 0))
        (if (i32.ge_u (local.get $m) (i32.const ${REAL1_RUN_MIN}))
          (then
        ;; the rest columns come in runs of m consecutive columns (target bit zero), 2m apart
        (block $runs_done
          (loop $runs
            (br_if $runs_done (i32.ge_u (local.get $c) (local.get $D)))
            (local.set $p00A (i32.add (local.get $b0) (i32.shl (local.get $c) (i32.const 4))))
            (local.set $p10A (i32.add (local.get $b1) (i32.shl (local.get $c) (i32.const 4))))
            (local.set $runEnd (i32.add (local.get $p00A) (local.get $mb)))
            (loop $run
              (local.set $p01A (i32.add (local.get $p00A) (local.get $mb)))
              (local.set $p11A (i32.add (local.get $p10A) (local.get $mb)))
              ${one.lines.join('\n              ')}
              (local.set $p00A (i32.add (local.get $p00A) (i32.const 16)))
              (local.set $p10A (i32.add (local.get $p10A) (i32.const 16)))
              (br_if $run (i32.lt_u (local.get $p00A) (local.get $runEnd))))
            (local.set $c (i32.add (local.get $c) (i32.shl (local.get $m) (i32.const 1))))
            (br $runs))))
          (else
        ;; short runs: the next rest column by bit arithmetic
        (block $cols_done
          (loop $cols
            (br_if $cols_done (i32.ge_u (local.get $c) (local.get $D)))
            (local.set $p00A (i32.add (local.get $b0) (i32.shl (local.get $c) (i32.const 4))))
            (local.set $p01A (i32.add (local.get $p00A) (local.get $mb)))
            (local.set $p10A (i32.add (local.get $b1) (i32.shl (local.get $c) (i32.const 4))))
            (local.set $p11A (i32.add (local.get $p10A) (local.get $mb)))
            ${one.lines.join('\n            ')}
            (local.set $c (i32.and (i32.add (i32.or (local.get $c) (local.get $m)) (i32.const 1)) (i32.xor (local.get $m) (i32.const -1))))
            (br $cols)))))
        (local.set $idx (i32.add (local.get $idx) (i32.const 1)))
        (br $rows)))
  )`;
}

/**
 * 2-qubit block code for blocks with suffixes `sfx` at rows rb0_s … rb3_s, columns c0 … c3:
 * coordinates u_J to scratch[256·s …], the 16 outputs to scratch[512 + 256·s …] (products four
 * output rows at a time, each matrix entry loaded once for all the blocks; every output a
 * left-to-right chain), inverse transforms, writes and mirrored writes.
 */
function real2Blocks(sfx) {
  const b = new Body();
  sfx.forEach((s, sIndex) => {
    for (let a = 0; a < 4; a++) for (let c = 0; c < 4; c++) b.set(`x${a}${c}${s}`, `(v128.load (i32.add (local.get $rb${a}${s}) (local.get $c${c})))`);
    const V = {};
    for (let a2 = 0; a2 < 2; a2++)
      for (let b2 = 0; b2 < 2; b2++) {
        const e = (a1, b1) => `x${2 * a1 + a2}${2 * b1 + b2}${s}`;
        const w = forward(b, [null, null, `v2_${a2}${b2}${s}`, `v3_${a2}${b2}${s}`], e(0, 0), e(0, 1), e(1, 0), e(1, 1));
        for (let j1 = 0; j1 < 4; j1++) V[`${j1}${a2}${b2}`] = w[j1];
      }
    const u = [];
    for (let j1 = 0; j1 < 4; j1++) {
      const w = forward(b, [null, null, `u${4 * j1 + 2}${s}`, `u${4 * j1 + 3}${s}`], V[`${j1}00`], V[`${j1}01`], V[`${j1}10`], V[`${j1}11`]);
      for (let j2 = 0; j2 < 4; j2++) u[4 * j1 + j2] = w[j2];
    }
    for (let j = 0; j < 16; j++) b.emit(`(v128.store offset=${256 * sIndex + 16 * j} (local.get $scratch) ${get(u[j])})`);
  });
  // products: a loop over the four groups of four output rows, and inside it a loop over the 16
  // coordinates J carrying 4 accumulators per block (few live values: nothing spills). The
  // accumulators start at −0, the exact identity of addition, so each output is the JS
  // kernel's chain M[i][0]·u_0 + M[i][1]·u_1 + … bit for bit.
  const groupsBody = new Body();
  for (let k = 0; k < 4; k++) for (const s of sfx) groupsBody.set(`acc${k}${s}`, '(v128.const i64x2 0x8000000000000000 0x8000000000000000)');
  const terms = new Body();
  for (let t = 0; t < TERMS_PER_STEP; t++) {
    sfx.forEach((s, sIndex) => terms.set(`uj${s}`, `(v128.load offset=${256 * sIndex + 16 * t} (local.get $pu))`));
    for (let k = 0; k < 4; k++) {
      terms.set('mij', `(v128.load offset=${256 * k + 16 * t} (local.get $pk))`);
      for (const s of sfx) terms.set(`acc${k}${s}`, `(f64x2.add ${get(`acc${k}${s}`)} (f64x2.mul ${get('mij')} ${get(`uj${s}`)}))`);
    }
  }
  for (const l of terms.locals) b.locals.add(l);
  for (const l of groupsBody.locals) b.locals.add(l);
  const stores = [];
  sfx.forEach((s, sIndex) => {
    for (let k = 0; k < 4; k++) stores.push(`(v128.store offset=${512 + 256 * sIndex + 16 * k} (local.get $py) ${get(`acc${k}${s}`)})`);
  });
  b.emit(`(local.set $pm (i32.add (local.get $scratch) (i32.const ${MAT_SPLATS})))
                (local.set $py (local.get $scratch))
                (loop $groups
                  ${groupsBody.lines.join('\n                  ')}
                  (local.set $pu (local.get $scratch))
                  (local.set $pk (local.get $pm))
                  (loop $terms
                    ${terms.lines.join('\n                    ')}
                    (local.set $pk (i32.add (local.get $pk) (i32.const ${16 * TERMS_PER_STEP})))
                    (local.set $pu (i32.add (local.get $pu) (i32.const ${16 * TERMS_PER_STEP})))
                    (br_if $terms (i32.lt_u (local.get $pu) (local.get $uEnd))))
                  ${stores.join('\n                  ')}
                  ;; next group: four rows further in the splatted M'
                  (local.set $pm (i32.add (local.get $pm) (i32.const 1024)))
                  (local.set $py (i32.add (local.get $py) (i32.const 64)))
                  (br_if $groups (i32.lt_u (local.get $py) (local.get $yEnd))))`);
  sfx.forEach((s, sIndex) => {
    const y = Array.from({ length: 16 }, (_, i) => b.set(`y${i}${s}`, `(v128.load offset=${512 + 256 * sIndex + 16 * i} (local.get $scratch))`));
    const W = {};
    for (let j1 = 0; j1 < 4; j1++) {
      const names = [`w${j1}_00${s}`, `w${j1}_01${s}`, `w${j1}_10${s}`, `w${j1}_11${s}`];
      const z = inverse(b, [y[4 * j1], y[4 * j1 + 1], y[4 * j1 + 2], y[4 * j1 + 3]], names);
      for (let k = 0; k < 4; k++) W[`${j1}${['00', '01', '10', '11'][k]}`] = z[names[k]];
    }
    const Z = {};
    for (let a2 = 0; a2 < 2; a2++)
      for (let b2 = 0; b2 < 2; b2++) {
        const nm = (a1, b1) => `z${2 * a1 + a2}${2 * b1 + b2}${s}`;
        const names = [nm(0, 0), nm(0, 1), nm(1, 0), nm(1, 1)];
        const z = inverse(b, [W[`0${a2}${b2}`], W[`1${a2}${b2}`], W[`2${a2}${b2}`], W[`3${a2}${b2}`]], names);
        for (const k of names) Z[k] = z[k];
      }
    for (let a = 0; a < 4; a++) for (let c = 0; c < 4; c++) b.emit(`(v128.store (i32.add (local.get $rb${a}${s}) (local.get $c${c})) ${get(Z[`z${a}${c}${s}`])})`);
    // mirror: ρ[c + o_c][r + o_a] = conj(z_ac), unless the block is on the diagonal (c = r)
    const mirror = [];
    for (let c = 0; c < 4; c++)
      for (let a = 0; a < 4; a++) mirror.push(`(v128.store (i32.add (local.get $cb${c}) (local.get $ro${a}${s})) (v128.xor ${get(Z[`z${a}${c}${s}`])} ${get('signIm')}))`);
    b.set('signIm', `(v128.load offset=${SIGN_SLOT} (local.get $scratch))`);
    b.emit(`(if (i32.ne (local.get $c) (local.get $r${s})) (then
                  ${mirror.join('\n                  ')}))`);
  });
  return b;
}

/**
 * The 2-qubit mirrored kernel: tiles [tileStart, tileEnd) of `tile` rest rows; blocks (r, c)
 * with rest index i ≤ j are computed (two rows r at a time), block (c, r) is written as the
 * conjugate transpose. 1024 bytes of scratch at `scratch`.
 */
function real2() {
  const two = real2Blocks(['A', 'B']);
  const one = real2Blocks(['A']);
  const body = new Body();
  for (const l of [...two.locals, ...one.locals]) body.locals.add(l);
  const nextRest = (x) => `(i32.and (i32.add (i32.or ${x} (local.get $tm)) (i32.const 1)) (i32.xor (local.get $tm) (i32.const -1)))`;
  const i32s = ['si', 'pm', 'pk', 'pu', 'py', 'uEnd', 'yEnd', 'D', 'rowBytes', 'm1', 'm2', 'lo', 'hi', 'tm', 'o1', 'o2', 'o3', 'R', 'tileNo', 't0', 't1', 'r0', 'j', 'i', 'iEnd', 'c', 'rA', 'rB'];
  const i32b = ['c0', 'c1', 'c2', 'c3', 'cb0', 'cb1', 'cb2', 'cb3'];
  for (const s of ['A', 'B']) for (let k = 0; k < 4; k++) i32b.push(`rb${k}${s}`, `ro${k}${s}`);
  // rb_a, cb_a: byte address of row (r + o_a) / (c + o_a); c_b, ro_b: byte offset of column (c + o_b) / (r + o_b)
  const offs = ['(i32.const 0)', '(local.get $o1)', '(local.get $o2)', '(local.get $o3)'];
  const rowAddr = (dst, base, o) => `(local.set $${dst} (i32.add (local.get $rho) (i32.mul (i32.add (local.get $${base}) ${o}) (local.get $rowBytes))))`;
  const colOff = (dst, base, o) => `(local.set $${dst} (i32.shl (i32.add (local.get $${base}) ${o}) (i32.const 4)))`;
  const rowsOf = (s) => [0, 1, 2, 3].flatMap((k) => [rowAddr(`rb${k}${s}`, `r${s}`, offs[k]), colOff(`ro${k}${s}`, `r${s}`, offs[k])]).join('\n                ');
  return `
  ;; rho -> Phi(rho) on qubits (q1, q2), real-form M' (16 x 16 f64) at mat, rho Hermitian;
  ;; tiles [tileStart, tileEnd) of \`tile\` rest rows; scratch: SCRATCH_BYTES at scratch
  (func (export "real2") (param $rho i32) (param $n i32) (param $q1 i32) (param $q2 i32) (param $mat i32) (param $scratch i32) (param $tile i32) (param $tileStart i32) (param $tileEnd i32)
    ${declare([...i32s, ...i32b], body)}
    (local.set $D (i32.shl (i32.const 1) (local.get $n)))
    (local.set $rowBytes (i32.shl (local.get $D) (i32.const 4)))
    (local.set $m1 (i32.shl (i32.const 1) (i32.sub (i32.sub (local.get $n) (i32.const 1)) (local.get $q1))))
    (local.set $m2 (i32.shl (i32.const 1) (i32.sub (i32.sub (local.get $n) (i32.const 1)) (local.get $q2))))
    (local.set $tm (i32.or (local.get $m1) (local.get $m2)))
    (local.set $lo (select (local.get $m1) (local.get $m2) (i32.lt_u (local.get $m1) (local.get $m2))))
    (local.set $hi (i32.xor (local.get $tm) (local.get $lo)))
    ;; local index a = 2·bit(q1) + bit(q2): register offsets o0 … o3
    (local.set $o1 (local.get $m2))
    (local.set $o2 (local.get $m1))
    (local.set $o3 (local.get $tm))
    (local.set $R (i32.shr_u (local.get $D) (i32.const 2)))
    ${splatMatrix(16)}
    (v128.store offset=${SIGN_SLOT} (local.get $scratch) ${SIGN_IM})
    (local.set $uEnd (i32.add (local.get $scratch) (i32.const 256)))
    (local.set $yEnd (i32.add (local.get $scratch) (i32.const 256)))
    (local.set $tileNo (local.get $tileStart))
    (block $tiles_done
      (loop $tiles
        (br_if $tiles_done (i32.ge_u (local.get $tileNo) (local.get $tileEnd)))
        (local.set $t0 (i32.mul (local.get $tileNo) (local.get $tile)))
        (local.set $t1 (i32.add (local.get $t0) (local.get $tile)))
        (if (i32.gt_u (local.get $t1) (local.get $R)) (then (local.set $t1 (local.get $R))))
        ;; r0 = the t0-th rest index: zeros inserted at the lower, then the higher target bit
        (local.set $r0 (i32.or
          (i32.shl (i32.and (local.get $t0) (i32.xor (i32.sub (local.get $lo) (i32.const 1)) (i32.const -1))) (i32.const 1))
          (i32.and (local.get $t0) (i32.sub (local.get $lo) (i32.const 1)))))
        (local.set $r0 (i32.or
          (i32.shl (i32.and (local.get $r0) (i32.xor (i32.sub (local.get $hi) (i32.const 1)) (i32.const -1))) (i32.const 1))
          (i32.and (local.get $r0) (i32.sub (local.get $hi) (i32.const 1)))))
        (local.set $j (local.get $t0))
        (local.set $c (local.get $r0))
        (block $cols_done
          (loop $cols
            (br_if $cols_done (i32.ge_u (local.get $j) (local.get $R)))
            ${[0, 1, 2, 3].map((k) => colOff(`c${k}`, 'c', offs[k])).join('\n            ')}
            ${[0, 1, 2, 3].map((k) => rowAddr(`cb${k}`, 'c', offs[k])).join('\n            ')}
            (local.set $iEnd (select (i32.add (local.get $j) (i32.const 1)) (local.get $t1) (i32.lt_u (local.get $j) (local.get $t1))))
            (local.set $i (local.get $t0))
            (local.set $rA (local.get $r0))
            (block $blocks_done
              (loop $blocks
                (br_if $blocks_done (i32.ge_u (local.get $i) (local.get $iEnd)))
                ${rowsOf('A')}
                (if (i32.lt_u (i32.add (local.get $i) (i32.const 1)) (local.get $iEnd))
                  (then
                    ;; two blocks: rows rA and the next rest row rB, same columns
                    (local.set $rB ${nextRest('(local.get $rA)')})
                    ${rowsOf('B')}
                    ${two.lines.join('\n                    ')}
                    (local.set $i (i32.add (local.get $i) (i32.const 2)))
                    (local.set $rA ${nextRest('(local.get $rB)')}))
                  (else
                    ${one.lines.join('\n                    ')}
                    (local.set $i (i32.add (local.get $i) (i32.const 1)))
                    (local.set $rA ${nextRest('(local.get $rA)')})))
                (br $blocks)))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (local.set $c ${nextRest('(local.get $c)')})
            (br $cols)))
        (local.set $tileNo (i32.add (local.get $tileNo) (i32.const 1)))
        (br $tiles)))
  )`;
}

/** Byte offsets in a part's scratch of the diagonal kernel's packed-index tables (2^DIAG_LO_BITS i32 entries each). */
const DIAG_LO_A = 0;
const DIAG_LO_B = 512;
const DIAG_HI_A = 1024;
const DIAG_HI_B = 1536;
/** Column bits of the diagonal kernel's inner loop (at most; the rest is its outer loop): 2^7 = 128 entries per table. */
const DIAG_LO_BITS = 7;
/** Elements per step of the diagonal kernel's inner loop (1 or 2; 2 measured no faster on the bench machine). */
const DIAG_UNROLL = 1;

/**
 * Fills the scratch table at byte offset `dst` with 16·pack(i << sh) for i < count: the bits of the
 * register index on the k qubits packed in `q` (4 bits per qubit, first listed = most significant,
 * as src/engine/kernelDiagonal.ts packs them), as a byte offset of a complex table entry.
 */
function packTable(dst, k, q, sh, count) {
  return `(local.set $i (i32.const 0))
    (block $fill_done_${dst}
      (loop $fill_${dst}
        (br_if $fill_done_${dst} (i32.ge_u (local.get $i) ${count}))
        (local.set $v (i32.const 0))
        (local.set $t (i32.const 0))
        (block $bits_done_${dst}
          (loop $bits_${dst}
            (br_if $bits_done_${dst} (i32.ge_u (local.get $t) (local.get ${k})))
            (local.set $v (i32.or (i32.shl (local.get $v) (i32.const 1))
              (i32.and (i32.const 1) (i32.shr_u (i32.shl (local.get $i) ${sh})
                (i32.sub (local.get $nm1) (i32.and (i32.shr_u (local.get ${q}) (i32.shl (local.get $t) (i32.const 2))) (i32.const 15)))))))
            (local.set $t (i32.add (local.get $t) (i32.const 1)))
            (br $bits_${dst})))
        (i32.store offset=${dst} (i32.add (local.get $scratch) (i32.shl (local.get $i) (i32.const 2))) (i32.shl (local.get $v) (i32.const 4)))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $fill_${dst})))`;
}

/**
 * Exact complex product u·v as the JS kernels write it, (u_r·v_r − u_i·v_i, u_r·v_i + u_i·v_r):
 * splat(u_r)·v + (splat(u_i)·swap(v) with lane 0 negated); x + (−y) is IEEE 754's x − y, and
 * negation is exact. `ur`, `ui` are the splatted parts, `v`, `vs` = v and swap(v).
 */
function complexProduct(ur, ui, v, vs) {
  return `(f64x2.add (f64x2.mul ${ur} ${v}) (v128.xor (f64x2.mul ${ui} ${vs}) (local.get $signRe)))`;
}

/**
 * The diagonal kernel (src/engine/kernelDiagonal.ts): ρ[r][c] ← ρ[r][c] · (T_A[…] · T_B[…]) (or
 * ρ[r][c] · T_A[…] when kB = 0) for rows [start, end), the same two complex products per element
 * in the same order as the JS kernel. The packed index of a row or column is the sum of the packed
 * indices of its low DIAG_LO_BITS bits and of the rest (disjoint bits), looked up in four small
 * tables built in the scratch at the call's start.
 */
function diagonal() {
  /** The element `u` steps further: ρ entry at p + 16u, lo-table entry at pl + 4u. */
  const element = (two, u) => {
    const x = '(local.get $p)';
    const ta = `(i32.add (local.get $ha) (i32.load offset=${DIAG_LO_A + 4 * u} (local.get $pl)))`;
    const tb = `(i32.add (local.get $hb) (i32.load offset=${DIAG_LO_B + 4 * u} (local.get $pl)))`;
    const f = two
      ? `(local.set $ea ${ta})
                (local.set $b (v128.load ${tb}))
                (local.set $f ${complexProduct('(v128.load64_splat (local.get $ea))', '(v128.load64_splat offset=8 (local.get $ea))', '(local.get $b)', swap('(local.get $b)'))})`
      : `(local.set $f (v128.load ${ta}))`;
    return `${f}
                (v128.store offset=${16 * u} ${x} ${complexProduct(`(v128.load64_splat offset=${16 * u} ${x})`, `(v128.load64_splat offset=${16 * u + 8} ${x})`, '(local.get $f)', swap('(local.get $f)'))})`;
  };
  const inner = (two) => `(local.set $pl (local.get $scratch))
              (loop $cols${two ? '2' : '1'}
                ${Array.from({ length: DIAG_UNROLL }, (_, u) => element(two, u)).join('\n                ')}
                (local.set $p (i32.add (local.get $p) (i32.const ${16 * DIAG_UNROLL})))
                (local.set $pl (i32.add (local.get $pl) (i32.const ${4 * DIAG_UNROLL})))
                (br_if $cols${two ? '2' : '1'} (i32.lt_u (local.get $pl) (local.get $plEnd))))`;
  const rows = (two) => `(local.set $r (local.get $start))
      (block $rows_done${two ? '2' : '1'}
        (loop $rows${two ? '2' : '1'}
          (br_if $rows_done${two ? '2' : '1'} (i32.ge_u (local.get $r) (local.get $end)))
          ;; row r's table rows: (packed row index) · d · 16 bytes = (16 · packed index) << k
          (local.set $ra (i32.add (local.get $tabA) (i32.shl (i32.add
            (i32.load offset=${DIAG_LO_A} (i32.add (local.get $scratch) (i32.shl (i32.and (local.get $r) (local.get $loMask)) (i32.const 2))))
            (i32.load offset=${DIAG_HI_A} (i32.add (local.get $scratch) (i32.shl (i32.shr_u (local.get $r) (local.get $L)) (i32.const 2)))))
            (local.get $kA))))
          ${two ? `(local.set $rb (i32.add (local.get $tabB) (i32.shl (i32.add
            (i32.load offset=${DIAG_LO_B} (i32.add (local.get $scratch) (i32.shl (i32.and (local.get $r) (local.get $loMask)) (i32.const 2))))
            (i32.load offset=${DIAG_HI_B} (i32.add (local.get $scratch) (i32.shl (i32.shr_u (local.get $r) (local.get $L)) (i32.const 2)))))
            (local.get $kB))))` : ''}
          (local.set $p (i32.add (local.get $rho) (i32.mul (local.get $r) (local.get $rowBytes))))
          (local.set $ph (local.get $scratch))
          (loop $his${two ? '2' : '1'}
            (local.set $ha (i32.add (local.get $ra) (i32.load offset=${DIAG_HI_A} (local.get $ph))))
            ${two ? `(local.set $hb (i32.add (local.get $rb) (i32.load offset=${DIAG_HI_B} (local.get $ph))))` : ''}
            ${inner(two)}
            (local.set $ph (i32.add (local.get $ph) (i32.const 4)))
            (br_if $his${two ? '2' : '1'} (i32.lt_u (local.get $ph) (local.get $phEnd))))
          (local.set $r (i32.add (local.get $r) (i32.const 1)))
          (br $rows${two ? '2' : '1'})))`;
  const i32s = ['i', 'v', 't', 'nm1', 'L', 'loMask', 'rowBytes', 'r', 'ra', 'rb', 'ha', 'hb', 'ea', 'p', 'pl', 'plEnd', 'ph', 'phEnd'];
  return `
  ;; rho[r][c] *= T_A[pack_A(r), pack_A(c)] * T_B[pack_B(r), pack_B(c)] (T_B only when kB > 0) for rows [start, end);
  ;; tables at tabA, tabB (complex f64, row-major), over the kA (kB) qubits packed 4 bits each in qa (qb), kA, kB <= 7
  (func (export "diagonal") (param $rho i32) (param $n i32) (param $tabA i32) (param $kA i32) (param $qa i32) (param $tabB i32) (param $kB i32) (param $qb i32) (param $scratch i32) (param $start i32) (param $end i32)
    ${i32s.map((v) => `(local $${v} i32)`).join(' ')} (local $b v128) (local $f v128) (local $signRe v128)
    (local.set $signRe (v128.const i64x2 0x8000000000000000 0))
    (local.set $nm1 (i32.sub (local.get $n) (i32.const 1)))
    (local.set $L (select (local.get $n) (i32.const ${DIAG_LO_BITS}) (i32.lt_u (local.get $n) (i32.const ${DIAG_LO_BITS}))))
    (local.set $loMask (i32.sub (i32.shl (i32.const 1) (local.get $L)) (i32.const 1)))
    (local.set $rowBytes (i32.shl (i32.const 16) (local.get $n)))
    ;; the inner loop runs over the 2^L low column bits, the outer one over the 2^(n − L) high ones
    (local.set $plEnd (i32.add (local.get $scratch) (i32.shl (i32.const 1) (i32.add (local.get $L) (i32.const 2)))))
    (local.set $phEnd (i32.add (local.get $scratch) (i32.shl (i32.const 1) (i32.add (i32.sub (local.get $n) (local.get $L)) (i32.const 2)))))
    ${packTable(DIAG_LO_A, '$kA', '$qa', '(i32.const 0)', '(i32.shl (i32.const 1) (local.get $L))')}
    ${packTable(DIAG_HI_A, '$kA', '$qa', '(local.get $L)', '(i32.shl (i32.const 1) (i32.sub (local.get $n) (local.get $L)))')}
    ${packTable(DIAG_LO_B, '$kB', '$qb', '(i32.const 0)', '(i32.shl (i32.const 1) (local.get $L))')}
    ${packTable(DIAG_HI_B, '$kB', '$qb', '(local.get $L)', '(i32.shl (i32.const 1) (i32.sub (local.get $n) (local.get $L)))')}
    (if (i32.eqz (local.get $kB))
      (then
      ${rows(false)})
      (else
      ${rows(true)}))
  )`;
}

/** The memory floor: every double of [ptr, ptr + bytes) read, scaled and written once (bytes a multiple of 64). */
function stream() {
  const lines = [];
  for (let k = 0; k < 4; k++) {
    lines.push(`(v128.store offset=${16 * k} (local.get $p) (f64x2.mul (v128.load offset=${16 * k} (local.get $p)) (local.get $s)))`);
  }
  return `
  ;; streaming pass: x -> 0.999999 x over [ptr, ptr + bytes), 64 bytes per iteration
  (func (export "stream") (param $ptr i32) (param $bytes i32)
    (local $p i32) (local $end i32) (local $s v128)
    (local.set $s (f64x2.splat (f64.const 0.999999)))
    (local.set $p (local.get $ptr))
    (local.set $end (i32.add (local.get $ptr) (local.get $bytes)))
    (block $done
      (loop $next
        (br_if $done (i32.ge_u (local.get $p) (local.get $end)))
        ${lines.join('\n        ')}
        (local.set $p (i32.add (local.get $p) (i32.const 64)))
        (br $next)))
  )`;
}

/** The module's WebAssembly text. */
export function wasmKernelsText() {
  return `;; GENERATED by test/bench/generateWasmKernels.mjs — do not edit; change the generator.
(module
  (import "env" "memory" (memory 1 65536 shared))
${real1(false)}
${real1(true)}
${real2()}
${diagonal()}
${stream()}
)
`;
}

/** The assembled module (wabt, no debug names: the bytes depend only on the text). */
export async function wasmKernelsBinary() {
  const wabt = await wabtInit();
  const features = { simd: true, threads: true };
  const mod = wabt.parseWat('kernels.wat', wasmKernelsText(), features);
  mod.validate(features);
  const { buffer } = mod.toBinary({ log: false, write_debug_names: false });
  mod.destroy();
  return buffer;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  if (process.argv.includes('--wat')) process.stdout.write(wasmKernelsText());
  else {
    writeFileSync(outFile, await wasmKernelsBinary());
    console.log(`wrote ${outFile}`);
  }
}
