/**
 * Generates src/engine/kernels/kernels.generated.ts: the WebAssembly (SIMD128) module behind
 * the engine's fast paths (overlap-space and dense sweeps, native xoshiro256** draws),
 * embedded as base64 so the engine reads no file at run time. The WebAssembly text below is the
 * source of truth for the bodies; every function header comes from the signature table
 * (src/engine/kernels/signatures.ts), which also types the exports for the engine.
 * `npm run kernels:generate` assembles the text with wabt (a dev dependency used only here) and
 * rewrites the generated file; test/engine/kernels/generated.test.ts fails on any drift.
 *
 * Layout the kernels expect (all offsets are byte addresses in the module's memory, 16-aligned):
 *   xi     neuron-major patterns, int8 ±1: xi[i·pp + μ] = ξ_i^μ, rows padded with zeros to
 *          pp = P rounded up to 16, so one visit reads one contiguous row;
 *   m      overlaps m_μ = Σ_j ξ_j^μ s_j, pp lanes of int16 (variant "16", N ≤ 32767, so |m| ≤ N
 *          fits) or int32 (variant "32", any N); padding lanes stay 0;
 *   s      state, int8 in {−1, 0, +1};  next, prev: int8 scratch rows for synchronous steps;
 *   order  visiting order, int32;  noise: float64 uniforms, one per visit (Glauber).
 * The raw field is h_i = Σ_μ ξ_i^μ m_μ − self·s_i in int32 (exact: the caller checks P·(N+1) < 2^31).
 */
import { writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import wabtFactory from 'wabt'
import { KERNEL_MODULES, KERNEL_SIGNATURES, parseParam, SAMPLE_BLOCK, type KernelModule, type KernelName, type KernelSignature } from '../src/engine/kernels/signatures.js'

type Width = 16 | 32

/** The module being written and the exports whose header it has, so a table entry without a body (or one written twice) is caught. */
let writing: KernelModule = 'overlap'
const emitted = new Set<string>()

/**
 * The header of an exported function, from its entry in KERNEL_SIGNATURES (the one table of
 * names, modules, parameter order and types, and results): `(func [internal] (export "name") (param $p t)… [(result t)]`.
 */
function header (name: string, internal?: string): string {
  if (!Object.hasOwn(KERNEL_SIGNATURES, name)) throw new Error(`kernel ${name} is not in KERNEL_SIGNATURES (src/engine/kernels/signatures.ts)`)
  const signature: KernelSignature = KERNEL_SIGNATURES[name as KernelName]
  if (!signature.modules.includes(writing)) throw new Error(`kernel ${name} is written into module ${writing}, which its table entry does not list`)
  if (emitted.has(name)) throw new Error(`kernel ${name} is written twice into module ${writing}`)
  emitted.add(name)
  const params = signature.params.map((p) => {
    const { name: param, type } = parseParam(p)
    return ` (param $${param} ${type})`
  }).join('')
  return `(func ${internal !== undefined ? `${internal} ` : ''}(export "${name}")${params}${signature.result !== undefined ? ` (result ${signature.result})` : ''}`
}

/** Body that leaves Σ_μ ξ_row^μ m_μ in local $h; uses locals $r $e $mp $x $a $b $c $d. */
function dot (w: Width): string {
  const init = `
    (local.set $r (local.get $row))
    (local.set $e (i32.add (local.get $row) (local.get $pp)))
    (local.set $mp (local.get $m))
    (local.set $a (v128.const i32x4 0 0 0 0))
    (local.set $b (v128.const i32x4 0 0 0 0))`
  if (w === 16) {
    return `${init}
    (loop $dot
      (local.set $x (v128.load (local.get $r)))
      (local.set $a (i32x4.add (local.get $a) (i32x4.dot_i16x8_s (i16x8.extend_low_i8x16_s (local.get $x)) (v128.load (local.get $mp)))))
      (local.set $b (i32x4.add (local.get $b) (i32x4.dot_i16x8_s (i16x8.extend_high_i8x16_s (local.get $x)) (v128.load offset=16 (local.get $mp)))))
      (local.set $mp (i32.add (local.get $mp) (i32.const 32)))
      (br_if $dot (i32.lt_u (local.tee $r (i32.add (local.get $r) (i32.const 16))) (local.get $e))))
    ${horizontal()}`
  }
  return `${init}
    (local.set $c (v128.const i32x4 0 0 0 0))
    (local.set $d (v128.const i32x4 0 0 0 0))
    (loop $dot
      (local.set $x (v128.load (local.get $r)))
      (local.set $y (i16x8.extend_low_i8x16_s (local.get $x)))
      (local.set $a (i32x4.add (local.get $a) (i32x4.mul (i32x4.extend_low_i16x8_s (local.get $y)) (v128.load (local.get $mp)))))
      (local.set $b (i32x4.add (local.get $b) (i32x4.mul (i32x4.extend_high_i16x8_s (local.get $y)) (v128.load offset=16 (local.get $mp)))))
      (local.set $y (i16x8.extend_high_i8x16_s (local.get $x)))
      (local.set $c (i32x4.add (local.get $c) (i32x4.mul (i32x4.extend_low_i16x8_s (local.get $y)) (v128.load offset=32 (local.get $mp)))))
      (local.set $d (i32x4.add (local.get $d) (i32x4.mul (i32x4.extend_high_i16x8_s (local.get $y)) (v128.load offset=48 (local.get $mp)))))
      (local.set $mp (i32.add (local.get $mp) (i32.const 64)))
      (br_if $dot (i32.lt_u (local.tee $r (i32.add (local.get $r) (i32.const 16))) (local.get $e))))
    (local.set $a (i32x4.add (local.get $a) (local.get $c)))
    (local.set $b (i32x4.add (local.get $b) (local.get $d)))
    ${horizontal()}`
}

function horizontal (): string {
  return `(local.set $a (i32x4.add (local.get $a) (local.get $b)))
    (local.set $h (i32.add
      (i32.add (i32x4.extract_lane 0 (local.get $a)) (i32x4.extract_lane 1 (local.get $a)))
      (i32.add (i32x4.extract_lane 2 (local.get $a)) (i32x4.extract_lane 3 (local.get $a)))))`
}

/** Body that adds $delta·ξ_row to m; uses locals $r $e $mp $x $y $dv. */
function flip (w: Width): string {
  const init = `
    (local.set $r (local.get $row))
    (local.set $e (i32.add (local.get $row) (local.get $pp)))
    (local.set $mp (local.get $m))`
  if (w === 16) {
    return `${init}
    (local.set $dv (i16x8.splat (local.get $delta)))
    (loop $flip
      (local.set $x (v128.load (local.get $r)))
      (v128.store (local.get $mp) (i16x8.add (v128.load (local.get $mp)) (i16x8.mul (i16x8.extend_low_i8x16_s (local.get $x)) (local.get $dv))))
      (v128.store offset=16 (local.get $mp) (i16x8.add (v128.load offset=16 (local.get $mp)) (i16x8.mul (i16x8.extend_high_i8x16_s (local.get $x)) (local.get $dv))))
      (local.set $mp (i32.add (local.get $mp) (i32.const 32)))
      (br_if $flip (i32.lt_u (local.tee $r (i32.add (local.get $r) (i32.const 16))) (local.get $e))))`
  }
  return `${init}
    (local.set $dv (i32x4.splat (local.get $delta)))
    (loop $flip
      (local.set $x (v128.load (local.get $r)))
      (local.set $y (i16x8.extend_low_i8x16_s (local.get $x)))
      (v128.store (local.get $mp) (i32x4.add (v128.load (local.get $mp)) (i32x4.mul (i32x4.extend_low_i16x8_s (local.get $y)) (local.get $dv))))
      (v128.store offset=16 (local.get $mp) (i32x4.add (v128.load offset=16 (local.get $mp)) (i32x4.mul (i32x4.extend_high_i16x8_s (local.get $y)) (local.get $dv))))
      (local.set $y (i16x8.extend_high_i8x16_s (local.get $x)))
      (v128.store offset=32 (local.get $mp) (i32x4.add (v128.load offset=32 (local.get $mp)) (i32x4.mul (i32x4.extend_low_i16x8_s (local.get $y)) (local.get $dv))))
      (v128.store offset=48 (local.get $mp) (i32x4.add (v128.load offset=48 (local.get $mp)) (i32x4.mul (i32x4.extend_high_i16x8_s (local.get $y)) (local.get $dv))))
      (local.set $mp (i32.add (local.get $mp) (i32.const 64)))
      (br_if $flip (i32.lt_u (local.tee $r (i32.add (local.get $r) (i32.const 16))) (local.get $e))))`
}

/** int16 overlaps, 64 patterns per pass over the neurons: eight int16x8 accumulators. */
function overlapGroups16 (): string {
  const acc = ['$a', '$b', '$c', '$d', '$a4', '$a5', '$a6', '$a7']
  const zero = acc.map((v) => `(local.set ${v} (v128.const i32x4 0 0 0 0))`).join(' ')
  const body: string[] = []
  for (let q = 0; q < 4; q++) {
    body.push(`(local.set $x (v128.load offset=${16 * q} (local.get $r)))`)
    body.push(`(local.set ${acc[2 * q]} (i16x8.add (local.get ${acc[2 * q]}) (i16x8.mul (i16x8.extend_low_i8x16_s (local.get $x)) (local.get $sv))))`)
    body.push(`(local.set ${acc[2 * q + 1]} (i16x8.add (local.get ${acc[2 * q + 1]}) (i16x8.mul (i16x8.extend_high_i8x16_s (local.get $x)) (local.get $sv))))`)
  }
  const stores = acc.map((v, k) => `(v128.store offset=${16 * k} (local.get $r) (local.get ${v}))`).join(' ')
  return `
    (block $groupsDone
      (loop $group
        (br_if $groupsDone (i32.gt_u (i32.add (local.get $blk) (i32.const 64)) (local.get $pp)))
        ${zero}
        (local.set $r (i32.add (local.get $xi) (local.get $blk)))
        (local.set $sp (local.get $s))
        (loop $neuron64
          (local.set $sv (i16x8.splat (i32.load8_s (local.get $sp))))
          ${body.join('\n          ')}
          (local.set $r (i32.add (local.get $r) (local.get $pp)))
          (br_if $neuron64 (i32.lt_u (local.tee $sp (i32.add (local.get $sp) (i32.const 1))) (local.get $se))))
        (local.set $r (i32.add (local.get $m) (i32.mul (local.get $blk) (i32.const 2))))
        ${stores}
        (local.set $blk (i32.add (local.get $blk) (i32.const 64)))
        (br $group)))`
}

/**
 * Four fields at once (int16 overlaps): rows $r0..$r3 against the same overlaps, so each
 * pair of overlap loads and the loop control serve four neurons (about 7.5 instead of 13
 * instructions per 16 entries and neuron). Leaves Σ_μ ξ_rj^μ m_μ in $h0..$h3.
 */
function dot4 (): string {
  const acc = (j: number, half: number): string => `$q${2 * j + half}`
  const zero = [0, 1, 2, 3, 4, 5, 6, 7].map((k) => `(local.set $q${k} (v128.const i32x4 0 0 0 0))`).join(' ')
  const body: string[] = []
  for (let j = 0; j < 4; j++) {
    body.push(`(local.set $x (v128.load (i32.add (local.get $r${j}) (local.get $o))))`)
    body.push(`(local.set ${acc(j, 0)} (i32x4.add (local.get ${acc(j, 0)}) (i32x4.dot_i16x8_s (i16x8.extend_low_i8x16_s (local.get $x)) (local.get $ml))))`)
    body.push(`(local.set ${acc(j, 1)} (i32x4.add (local.get ${acc(j, 1)}) (i32x4.dot_i16x8_s (i16x8.extend_high_i8x16_s (local.get $x)) (local.get $mh))))`)
  }
  const sums: string[] = []
  for (let j = 0; j < 4; j++) {
    sums.push(`(local.set $x (i32x4.add (local.get ${acc(j, 0)}) (local.get ${acc(j, 1)})))
    (local.set $h${j} (i32.add
      (i32.add (i32x4.extract_lane 0 (local.get $x)) (i32x4.extract_lane 1 (local.get $x)))
      (i32.add (i32x4.extract_lane 2 (local.get $x)) (i32x4.extract_lane 3 (local.get $x)))))`)
  }
  return `
    ${zero}
    (local.set $o (i32.const 0))
    (local.set $mp (local.get $m))
    (loop $dot4
      (local.set $ml (v128.load (local.get $mp)))
      (local.set $mh (v128.load offset=16 (local.get $mp)))
      ${body.join('\n      ')}
      (local.set $mp (i32.add (local.get $mp) (i32.const 32)))
      (br_if $dot4 (i32.lt_u (local.tee $o (i32.add (local.get $o) (i32.const 16))) (local.get $pp))))
    ${sums.join('\n    ')}`
}

const LOCALS4 = `(local $o i32) (local $ml v128) (local $mh v128)
    (local $q0 v128) (local $q1 v128) (local $q2 v128) (local $q3 v128) (local $q4 v128) (local $q5 v128) (local $q6 v128) (local $q7 v128)
    (local $r0 i32) (local $r1 i32) (local $r2 i32) (local $r3 i32) (local $h0 i32) (local $h1 i32) (local $h2 i32) (local $h3 i32)
    (local $i0 i32) (local $i1 i32) (local $i2 i32) (local $i3 i32)`

/**
 * int16 asynchronous sweep, four visits per field computation. Fields of visits k..k+3 are
 * computed together from the current overlaps; they stay valid until one of those visits
 * changes a neuron, so the group is cut short there and the next group starts right after
 * it. Every decision therefore sees exactly the field the one-at-a-time sweep would.
 */
function sweep16Body (decide = `(local.set $v ${DECIDE})`): string {
  const visit = (j: number): string => `
          (local.set $i (local.get $i${j}))
          (local.set $row (local.get $r${j}))
          (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
          (local.set $h (i32.sub (local.get $h${j}) (i32.mul (local.get $self) (local.get $si))))
          ${decide}
          (if (i32.ne (local.get $v) (local.get $si))
            (then
              (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
              (local.set $delta (i32.sub (local.get $v) (local.get $si)))
              ${flip(16)}
              (local.set $changed (i32.const 1))
              (local.set $k (i32.add (local.get $k) (i32.const ${j + 1})))
              (br $visit)))`
  const load = (j: number): string => `
          (local.set $i${j} (i32.load offset=${4 * j} (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
          (local.set $r${j} (i32.add (local.get $xi) (i32.mul (local.get $i${j}) (local.get $pp))))`
  return `
    (local.set $k (i32.const 0))
    (block $done
      (loop $visit
        (br_if $done (i32.ge_u (local.get $k) (local.get $n)))
        (if (i32.le_u (i32.add (local.get $k) (i32.const 4)) (local.get $n))
          (then
            ${[0, 1, 2, 3].map(load).join('')}
            ${dot4()}
            ${[0, 1, 2, 3].map(visit).join('')}
            (local.set $k (i32.add (local.get $k) (i32.const 4)))
            (br $visit)))
        (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
        (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
        (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
        ${dot(16)}
        (local.set $h (i32.sub (local.get $h) (i32.mul (local.get $self) (local.get $si))))
        ${decide}
        (if (i32.ne (local.get $v) (local.get $si))
          (then
            (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
            (local.set $delta (i32.sub (local.get $v) (local.get $si)))
            ${flip(16)}
            (local.set $changed (i32.const 1))))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $visit)))`
}

function sweep16Locals (): string {
  return `${LOCALS} ${LOCALS4}
    (local $k i32) (local $i i32) (local $si i32) (local $v i32) (local $changed i32)`
}

function sweep16Grouped (): string {
  return `
  ${header('sweep16')}
    ${sweep16Locals()}
    ${sweep16Body()}
    (local.get $changed))`
}

/**
 * A whole zero-temperature asynchronous trial in one call (int16 overlaps): before each sweep
 * the visiting order is reshuffled in place (Fisher–Yates on the xoshiro256** state at $state,
 * as in "shuffle") unless $shuffle is 0, then one grouped sweep; stops after the first sweep
 * that changes nothing or after $max sweeps. Returns 2·sweeps + (1 if the last sweep changed
 * a neuron). The generator state and its last output are written back as in "shuffle".
 */
/**
 * The asynchronous sweep of runAsync16, recomputing only fields whose sign may have changed.
 * A flip of s_j by Δ changes every overlap by Δ·ξ_j^μ, so any field moves by at most |Δ|·P
 * (||Δm||₁; the flipped neuron's own field also moves by its self term, so it is marked stale).
 * Each neuron keeps its last exact field (hb) and the running bound G at that moment (gb); a
 * field further from 0 than G − gb still has its sign and is not 0, so the decision sign(h) is
 * the exact one. Near a fixed point (the last sweep of a trial, which changes nothing) most
 * fields are decided so without a dot product. Where a visit needs its field, the fields of the
 * next four visits are computed together (as sweep16) when another of them needs it too; each
 * is stored with the G of that moment, and a later flip only widens its bound.
 */
function boundedSweep16Body (): string {
  const hbAt = (j: string): string => `(i32.add (local.get $hb) (i32.shl ${j} (i32.const 2)))`
  const gbAt = (j: string): string => `(i32.add (local.get $gb) (i32.shl ${j} (i32.const 3)))`
  const needs = (j: string): string => `(i32.eqz (f64.gt
            (f64.convert_i32_s (select (local.tee $hv (i32.load ${hbAt(j)})) (i32.sub (i32.const 0) (local.get $hv)) (i32.ge_s (local.get $hv) (i32.const 0))))
            (f64.sub (local.get $G) (f64.load ${gbAt(j)}))))`
  const orderAt = (j: number): string => `(i32.load offset=${4 * j} (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2))))`
  const load = (j: number): string => `
              (local.set $i${j} ${orderAt(j)})
              (local.set $r${j} (i32.add (local.get $xi) (i32.mul (local.get $i${j}) (local.get $pp))))`
  const store = (j: number): string => `
              (i32.store ${hbAt(`(local.get $i${j})`)} (i32.sub (local.get $h${j}) (i32.mul (local.get $self) (i32.load8_s (i32.add (local.get $s) (local.get $i${j}))))))
              (f64.store ${gbAt(`(local.get $i${j})`)} (local.get $G))`
  return `
    (local.set $k (i32.const 0))
    (block $done
      (loop $visit
        (br_if $done (i32.ge_u (local.get $k) (local.get $n)))
        (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
        (if ${needs('(local.get $i)')}
          (then
            ;; (wasm evaluates both operands of i32.and: the look-ahead must not read past the order)
            (local.set $need (i32.const 0))
            (if (i32.le_u (i32.add (local.get $k) (i32.const 4)) (local.get $n))
              (then (local.set $need (i32.or (i32.or ${needs(orderAt(1))} ${needs(orderAt(2))}) ${needs(orderAt(3))}))))
            (if (local.get $need)
              (then
                ${[0, 1, 2, 3].map(load).join('')}
                ${dot4()}
                ${[0, 1, 2, 3].map(store).join('')})
              (else
                (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
                ${dot(16)}
                (i32.store ${hbAt('(local.get $i)')} (i32.sub (local.get $h) (i32.mul (local.get $self) (i32.load8_s (i32.add (local.get $s) (local.get $i))))))
                (f64.store ${gbAt('(local.get $i)')} (local.get $G))))))
        (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
        (local.set $h (i32.load ${hbAt('(local.get $i)')}))
        (local.set $v ${DECIDE})
        (if (i32.ne (local.get $v) (local.get $si))
          (then
            (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
            (local.set $delta (i32.sub (local.get $v) (local.get $si)))
            (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
            ${flip(16)}
            (local.set $G (f64.add (local.get $G) (f64.convert_i32_u (i32.mul (local.get $p)
              (select (local.get $delta) (i32.sub (i32.const 0) (local.get $delta)) (i32.ge_s (local.get $delta) (i32.const 0)))))))
            (f64.store ${gbAt('(local.get $i)')} (f64.const nan))
            (local.set $changed (i32.const 1))))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $visit)))`
}

/**
 * Σ_μ m_μ² over int16 overlaps (padding lanes 0), for the energy: pairs by i32x4.dot_i16x8_s
 * (2·32767² < 2³¹), summed as doubles, exact (below 2⁵³), so equal to the plain loop's sum.
 */
function sumSquares16 (): string {
  return `
  ${header('sumSquares16')}
    (local $q i32) (local $e i32) (local $x v128) (local $acc v128) (local $d v128)
    ${SUM_SQUARES_16}
    (f64.add (f64x2.extract_lane 0 (local.get $acc)) (f64x2.extract_lane 1 (local.get $acc))))`
}

/** Σ_μ m_μ² of the int16 overlaps at $m (stride $pp) into the two lanes of $acc (zero before); uses $q $e $x $d. */
const SUM_SQUARES_16 = `(local.set $e (i32.add (local.get $m) (i32.shl (local.get $pp) (i32.const 1))))
    (local.set $q (local.get $m))
    (loop $pairs
      (local.set $x (v128.load (local.get $q)))
      (local.set $d (i32x4.dot_i16x8_s (local.get $x) (local.get $x)))
      (local.set $acc (f64x2.add (local.get $acc) (f64x2.add (f64x2.convert_low_i32x4_s (local.get $d))
        (f64x2.convert_low_i32x4_s (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $d) (local.get $d))))))
      (br_if $pairs (i32.lt_u (local.tee $q (i32.add (local.get $q) (i32.const 16))) (local.get $e))))`

/**
 * One measured sweep of a Glauber trial, taken in the kernel: exactly the arithmetic of the
 * plain path's sample (engine/trial.ts with unbiased patterns, engine/trial-measures.ts
 * ThermalAverages.add), in its order. Overlaps o_μ = m_μ / N, their sums, the largest |o_ν|
 * over ν ≠ target, the energy per neuron −(Σ m_μ² − P·(N − zeros))/(2·N·N); the class is
 * "target" when o_target ≥ q ($patternLevel), else the host's classifySample() returns it (the rare, longer
 * rules stay in one place, engine/end-states.ts).
 */
function glauberSample16 (): string {
  const at = (field: keyof typeof SAMPLE_BLOCK): string => `(i32.add (local.get $block) (i32.const ${SAMPLE_BLOCK[field]}))`
  return `(local.set $best (f64.const 0))
          (local.set $mu (i32.const 0))
          (local.set $sums (i32.add ${at('overlaps')} (i32.shl (local.get $pp) (i32.const 3))))
          (loop $overlaps
            (local.set $ov (f64.div (f64.convert_i32_s (i32.load16_s (i32.add (local.get $m) (i32.shl (local.get $mu) (i32.const 1))))) (local.get $nf)))
            (local.set $ga (i32.shl (local.get $mu) (i32.const 3)))
            (f64.store (i32.add ${at('overlaps')} (local.get $ga)) (local.get $ov))
            (f64.store (i32.add (local.get $sums) (local.get $ga)) (f64.add (f64.load (i32.add (local.get $sums) (local.get $ga))) (local.get $ov)))
            (if (i32.and (i32.ne (local.get $mu) (local.get $target)) (f64.gt (f64.abs (local.get $ov)) (local.get $best)))
              (then (local.set $best (f64.abs (local.get $ov)))))
            (br_if $overlaps (i32.lt_u (local.tee $mu (i32.add (local.get $mu) (i32.const 1))) (local.get $p))))
          (f64.store ${at('otherSum')} (f64.add (f64.load ${at('otherSum')}) (local.get $best)))
          ;; Erased (0) entries of the state, for Σ_i s_i²: sixteen at a time, then the rest.
          (local.set $zeros (i32.const 0))
          (local.set $i (i32.const 0))
          (block $blocksDone
            (loop $blocks
              (br_if $blocksDone (i32.gt_u (i32.add (local.get $i) (i32.const 16)) (local.get $n)))
              (local.set $zeros (i32.add (local.get $zeros) (i32.popcnt (i8x16.bitmask
                (i8x16.eq (v128.load (i32.add (local.get $s) (local.get $i))) (v128.const i32x4 0 0 0 0))))))
              (local.set $i (i32.add (local.get $i) (i32.const 16)))
              (br $blocks)))
          (block $tailDone
            (loop $tail
              (br_if $tailDone (i32.ge_u (local.get $i) (local.get $n)))
              (if (i32.eqz (i32.load8_s (i32.add (local.get $s) (local.get $i)))) (then (local.set $zeros (i32.add (local.get $zeros) (i32.const 1)))))
              (local.set $i (i32.add (local.get $i) (i32.const 1)))
              (br $tail)))
          (local.set $acc (v128.const i32x4 0 0 0 0))
          ${SUM_SQUARES_16}
          (f64.store ${at('energySum')} (f64.add (f64.load ${at('energySum')})
            (f64.div
              (f64.neg (f64.sub (f64.add (f64x2.extract_lane 0 (local.get $acc)) (f64x2.extract_lane 1 (local.get $acc)))
                (f64.mul (f64.convert_i32_u (local.get $p)) (f64.convert_i32_u (i32.sub (local.get $n) (local.get $zeros))))))
              (f64.mul (f64.mul (f64.const 2) (local.get $nf)) (local.get $nf)))))
          (local.set $ga (i32.add ${at('classCounts')} (i32.shl
            (select (i32.const 0) (call $classifySample)
              (f64.ge (f64.load (i32.add ${at('overlaps')} (i32.shl (local.get $target) (i32.const 3)))) (local.get $patternLevel)))
            (i32.const 2))))
          (i32.store (local.get $ga) (i32.add (i32.load (local.get $ga)) (i32.const 1)))
          (i32.store ${at('count')} (i32.add (i32.load ${at('count')}) (i32.const 1)))`
}

function runAsync16 (): string {
  return `
  ${header('runAsync16')}
    ${sweep16Locals()} (local $G f64) (local $hv i32) (local $need i32)
    (local $w0 i64) (local $w1 i64) (local $w2 i64) (local $w3 i64) (local $wt i64) (local $wx i64) (local $drew i32)
    (local $fi i32) (local $fj i32) (local $fpi i32) (local $fpj i32) (local $ftmp i32) (local $sweeps i32)
    (local.set $w0 (i64.load (local.get $state)))
    (local.set $w1 (i64.load offset=8 (local.get $state)))
    (local.set $w2 (i64.load offset=16 (local.get $state)))
    (local.set $w3 (i64.load offset=24 (local.get $state)))
    ;; No field is known yet: NaN bounds fail every comparison.
    (memory.fill (local.get $gb) (i32.const 0xff) (i32.shl (local.get $n) (i32.const 3)))
    (loop $trial
      (local.set $sweeps (i32.add (local.get $sweeps) (i32.const 1)))
      (if (i32.and (local.get $shuffle) (i32.ge_u (local.get $n) (i32.const 2)))
        (then
          (local.set $drew (i32.const 1))
          (local.set $fi (i32.sub (local.get $n) (i32.const 1)))
          (loop $draw
            (local.set $wx (i64.mul (i64.rotl (i64.mul (local.get $w1) (i64.const 5)) (i64.const 7)) (i64.const 9)))
            (local.set $wt (i64.shl (local.get $w1) (i64.const 17)))
            (local.set $w2 (i64.xor (local.get $w2) (local.get $w0)))
            (local.set $w3 (i64.xor (local.get $w3) (local.get $w1)))
            (local.set $w1 (i64.xor (local.get $w1) (local.get $w2)))
            (local.set $w0 (i64.xor (local.get $w0) (local.get $w3)))
            (local.set $w2 (i64.xor (local.get $w2) (local.get $wt)))
            (local.set $w3 (i64.rotl (local.get $w3) (i64.const 45)))
            (local.set $wt (i64.extend_i32_u (i32.add (local.get $fi) (i32.const 1))))
            (local.set $fj (i32.wrap_i64 (i64.shr_u
              (i64.add
                (i64.mul (i64.shr_u (local.get $wx) (i64.const 32)) (local.get $wt))
                (i64.shr_u (i64.mul (i64.and (local.get $wx) (i64.const 0xffffffff)) (local.get $wt)) (i64.const 32)))
              (i64.const 32))))
            (local.set $fpi (i32.add (local.get $order) (i32.shl (local.get $fi) (i32.const 2))))
            (local.set $fpj (i32.add (local.get $order) (i32.shl (local.get $fj) (i32.const 2))))
            (local.set $ftmp (i32.load (local.get $fpi)))
            (i32.store (local.get $fpi) (i32.load (local.get $fpj)))
            (i32.store (local.get $fpj) (local.get $ftmp))
            (br_if $draw (local.tee $fi (i32.sub (local.get $fi) (i32.const 1)))))))
      (local.set $changed (i32.const 0))
      ${boundedSweep16Body()}
      (br_if $trial (i32.and (local.get $changed) (i32.lt_u (local.get $sweeps) (local.get $max)))))
    (i64.store (local.get $state) (local.get $w0))
    (i64.store offset=8 (local.get $state) (local.get $w1))
    (i64.store offset=16 (local.get $state) (local.get $w2))
    (i64.store offset=24 (local.get $state) (local.get $w3))
    (if (local.get $drew) (then (i64.store offset=32 (local.get $state) (local.get $wx))))
    (i32.add (i32.shl (local.get $sweeps) (i32.const 1)) (local.get $changed)))`
}

/**
 * A whole asynchronous Glauber trial in one call (int16 overlaps): $max sweeps, each preceded
 * by the Fisher–Yates reshuffle of the order (unless $shuffle is 0) and drawing one uniform
 * per visit, in visiting order, from the xoshiro256** state at $state: the stream the plain
 * loop consumes (it draws the sweep's uniforms after its shuffle, nothing in between).
 * Visits are grouped by four as in "sweep16" (a group is cut at the first visit that changes
 * a neuron), and 1 + exp(factor·h) comes from the table (onePlusExp). With $block 0, after
 * every sweep the host's sweepDone(sweep) runs, so the caller can read the state and observe,
 * as the plain loop does between sweeps. Otherwise the kernel takes the samples itself after
 * each sweep past $burnIn (glauberSample16, into the sample block at $block): no call leaves
 * the kernel but the rare classification below the pattern level $patternLevel. The generator state and
 * last output are written back at the end.
 */
function runGlauber16 (): string {
  // The generator's output is $wx here: $x is a v128 of the sweep body.
  const next = XOSHIRO_NEXT.replaceAll('$x', '$wx')
  const decide = `${next}
          (local.set $drew (i32.const 1))
          ${onePlusExp('(local.get $h)')}
          (local.set $v (select (i32.const 1) (i32.const -1)
            (f64.lt (f64.mul (f64.mul (f64.convert_i64_u (i64.shr_u (local.get $wx) (i64.const 11))) (f64.const 0x1p-53)) (local.get $g)) (f64.const 1))))`
  return `
  ${header('runGlauber16')}
    ${sweep16Locals()} ${TABLE_LOCALS}
    (local $s0 i64) (local $s1 i64) (local $s2 i64) (local $s3 i64) (local $t i64) (local $wx i64) (local $drew i32)
    (local $fi i32) (local $fj i32) (local $fpi i32) (local $fpj i32) (local $ftmp i32) (local $sweeps i32)
    (local $nf f64) (local $ov f64) (local $best f64) (local $mu i32) (local $sums i32) (local $zeros i32) (local $q i32) (local $acc v128)
    (local.set $nf (f64.convert_i32_u (local.get $n)))
    ${XOSHIRO_LOAD}
    (block $end
      (loop $trial
        (br_if $end (i32.ge_u (local.get $sweeps) (local.get $max)))
        (local.set $sweeps (i32.add (local.get $sweeps) (i32.const 1)))
        (if (i32.and (local.get $shuffle) (i32.ge_u (local.get $n) (i32.const 2)))
          (then
            (local.set $drew (i32.const 1))
            (local.set $fi (i32.sub (local.get $n) (i32.const 1)))
            (loop $draw
              ${next}
              (local.set $t (i64.extend_i32_u (i32.add (local.get $fi) (i32.const 1))))
              (local.set $fj ${BELOW_T.replaceAll('$x', '$wx')})
              (local.set $fpi (i32.add (local.get $order) (i32.shl (local.get $fi) (i32.const 2))))
              (local.set $fpj (i32.add (local.get $order) (i32.shl (local.get $fj) (i32.const 2))))
              (local.set $ftmp (i32.load (local.get $fpi)))
              (i32.store (local.get $fpi) (i32.load (local.get $fpj)))
              (i32.store (local.get $fpj) (local.get $ftmp))
              (br_if $draw (local.tee $fi (i32.sub (local.get $fi) (i32.const 1)))))))
        ${sweep16Body(decide)}
        (if (i32.eqz (local.get $block))
          (then (call $sweepDone (local.get $sweeps)))
          (else
            (if (i32.gt_u (local.get $sweeps) (local.get $burnIn))
              (then
          ${glauberSample16()}))))
        (br $trial)))
    (i64.store (local.get $state) (local.get $s0))
    (i64.store offset=8 (local.get $state) (local.get $s1))
    (i64.store offset=16 (local.get $state) (local.get $s2))
    (i64.store offset=24 (local.get $state) (local.get $s3))
    (if (local.get $drew) (then (i64.store offset=32 (local.get $state) (local.get $wx)))))`
}

/** The decision pass of the int16 synchronous step, four neurons per field computation. */
function syncFields16 (): string {
  const decide = (j: number): string => `
        (local.set $si (i32.load8_s (i32.add (local.get $s) (i32.add (local.get $i) (i32.const ${j})))))
        (local.set $h (i32.sub (local.get $h${j}) (i32.mul (local.get $self) (local.get $si))))
        (local.set $v ${DECIDE})
        (i32.store8 offset=${j} (i32.add (local.get $next) (local.get $i)) (local.get $v))
        (if (i32.ne (local.get $v) (local.get $si)) (then (local.set $same (i32.const 0))))`
  return `
    (block $groupsDone
      (loop $group
        (br_if $groupsDone (i32.gt_u (i32.add (local.get $i) (i32.const 4)) (local.get $n)))
        (local.set $r0 (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
        (local.set $r1 (i32.add (local.get $r0) (local.get $pp)))
        (local.set $r2 (i32.add (local.get $r1) (local.get $pp)))
        (local.set $r3 (i32.add (local.get $r2) (local.get $pp)))
        ${dot4()}
        ${[0, 1, 2, 3].map(decide).join('')}
        (local.set $i (i32.add (local.get $i) (i32.const 4)))
        (br $group)))`
}

const LOCALS = `(local $row i32) (local $r i32) (local $e i32) (local $mp i32) (local $h i32) (local $delta i32)
    (local $x v128) (local $y v128) (local $a v128) (local $b v128) (local $c v128) (local $d v128) (local $dv v128)`

/** When $check: $same ← 2 if the new state $next equals the state two steps back, $prev (a two-cycle). Uses $i. */
const TWO_CYCLE_CHECK = `(if (local.get $check)
      (then
        (local.set $i (i32.const 0))
        (block $differs
          (loop $compare
            (br_if $differs (i32.ne (i32.load8_s (i32.add (local.get $next) (local.get $i))) (i32.load8_s (i32.add (local.get $prev) (local.get $i)))))
            (br_if $compare (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
          (local.set $same (i32.const 2)))))`

/**
 * Glauber's 1 + exp(factor·h) for an integer field h, left in $g: read from the table at
 * $table, which holds it for h in [−$half, $half] (entry h + $half, 0 until first needed, since
 * 1 + exp(·) ≥ 1 is never 0), or computed with the host's exp outside the window. An entry is the
 * double f64.add(1, exp(f64.mul(factor, h))) computed the first time h occurs, so every read
 * gives the very value the plain path computes for that field; the caller zeroes the table
 * whenever the factor changes. Uses locals $gi $ga $g (TABLE_LOCALS).
 */
function onePlusExp (h: string): string {
  const direct = `(f64.add (f64.const 1) (call $exp (f64.mul (local.get $factor) (f64.convert_i32_s ${h}))))`
  return `(local.set $gi (i32.add ${h} (local.get $half)))
      (if (i32.le_u (local.get $gi) (i32.shl (local.get $half) (i32.const 1)))
        (then
          (local.set $ga (i32.add (local.get $table) (i32.shl (local.get $gi) (i32.const 3))))
          (local.set $g (f64.load (local.get $ga)))
          (if (f64.eq (local.get $g) (f64.const 0))
            (then
              (local.set $g ${direct})
              (f64.store (local.get $ga) (local.get $g)))))
        (else (local.set $g ${direct})))`
}

const TABLE_LOCALS = '(local $gi i32) (local $ga i32) (local $g f64)'

/** The zero-temperature decision: v = +1 if h > 0, −1 if h < 0, else unchanged (the tie rule). */
const DECIDE = '(select (i32.const 1) (select (i32.const -1) (local.get $si) (i32.lt_s (local.get $h) (i32.const 0))) (i32.gt_s (local.get $h) (i32.const 0)))'

/** The one-visit-at-a-time asynchronous sweep (int32 overlaps). */
function sweepOne (w: Width): string {
  return `
  ${header(`sweep${w}`)}
    ${LOCALS}
    (local $k i32) (local $ke i32) (local $i i32) (local $si i32) (local $v i32) (local $changed i32)
    (local.set $k (local.get $order))
    (local.set $ke (i32.add (local.get $order) (i32.shl (local.get $n) (i32.const 2))))
    (loop $visit
      (local.set $i (i32.load (local.get $k)))
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${dot(w)}
      (local.set $h (i32.sub (local.get $h) (i32.mul (local.get $self) (local.get $si))))
      (local.set $v ${DECIDE})
      (if (i32.ne (local.get $v) (local.get $si))
        (then
          (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
          (local.set $delta (i32.sub (local.get $v) (local.get $si)))
          ${flip(w)}
          (local.set $changed (i32.const 1))))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 4))) (local.get $ke))))
    (local.get $changed))`
}

/**
 * One synchronous zero-temperature step as a block: leaves in $same 1 if s(t) = s(t−1) (state
 * left as is), 2 if s(t) equals prev (compared when $check), else 0; unless 1, prev ← s(t−1)
 * and s, m ← s(t), m updated from the changed neurons only.
 */
function syncBody (w: Width): string {
  return `
    (block $step
    (local.set $same (i32.const 1))
    (local.set $i (i32.const 0))
    ${w === 16 ? syncFields16() : ''}
    (if (i32.lt_u (local.get $i) (local.get $n)) (then
    (loop $visit
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${dot(w)}
      (local.set $h (i32.sub (local.get $h) (i32.mul (local.get $self) (local.get $si))))
      (local.set $v ${DECIDE})
      (i32.store8 (i32.add (local.get $next) (local.get $i)) (local.get $v))
      (if (i32.ne (local.get $v) (local.get $si)) (then (local.set $same (i32.const 0))))
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))))
    (br_if $step (local.get $same))
    ${TWO_CYCLE_CHECK}
    (local.set $i (i32.const 0))
    (loop $apply
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $v (i32.load8_s (i32.add (local.get $next) (local.get $i))))
      (i32.store8 (i32.add (local.get $prev) (local.get $i)) (local.get $si))
      (if (i32.ne (local.get $v) (local.get $si))
        (then
          (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
          (local.set $delta (i32.sub (local.get $v) (local.get $si)))
          (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
          ${flip(w)}))
      (br_if $apply (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n)))))`
}

/**
 * A whole zero-temperature synchronous trial in one call: steps t = 1, 2, … (the two-cycle
 * compared from t = 2 on) until a fixed point, a two-cycle or $max steps. Returns
 * 4·steps + ending (0 limit reached, 1 fixed point, 2 two-cycle).
 */
/**
 * A whole zero-temperature synchronous trial (int16 overlaps) that recomputes only the fields
 * whose sign may have changed. After a step that changes c neurons, every field moves by at
 * most ||Δm||₁ = Σ_μ |Δm_μ| (the sum of the overlaps' changes; the changes of c neurons partly
 * cancel, so this is far below 2cP), and a field whose last exact value h has |h| greater than
 * the sum of those bounds since it was computed still has h's sign and is not 0: its decision,
 * sign(h), is the one the exact field gives. Each neuron keeps its last exact field (hb, int32)
 * and the cumulative bound G at that moment (gb, float64, exact below 2⁵³); neurons that
 * change are recomputed on the next step (their self term moved), and the first step computes
 * every field. Late steps, near a fixed point, then compute a few per cent of the fields.
 * Same contract and result as runSync16 without the bounds: every decision is exact.
 */
function runSync16Bounded (): string {
  const hbAt = (j: string): string => `(i32.add (local.get $hb) (i32.shl ${j} (i32.const 2)))`
  const gbAt = (j: string): string => `(i32.add (local.get $gb) (i32.shl ${j} (i32.const 3)))`
  /** 1 when neuron ${j} needs its exact field this step. */
  const needs = (j: string): string => `(i32.or (local.get $first)
          (i32.eqz (f64.gt
            (f64.convert_i32_s (select (local.tee $hv (i32.load ${hbAt(j)})) (i32.sub (i32.const 0) (local.get $hv)) (i32.ge_s (local.get $hv) (i32.const 0))))
            (f64.sub (local.get $G) (f64.load ${gbAt(j)})))))`
  const exactOne = (j: string): string => `
          (local.set $row (i32.add (local.get $xi) (i32.mul ${j} (local.get $pp))))
          ${dot(16)}
          (i32.store ${hbAt(j)} (i32.sub (local.get $h) (i32.mul (local.get $self) (i32.load8_s (i32.add (local.get $s) ${j})))))
          (f64.store ${gbAt(j)} (local.get $G))`
  const decideAt = (j: string, offset: number): string => `
        (local.set $si (i32.load8_s offset=${offset} (i32.add (local.get $s) ${j})))
        (local.set $h (i32.load offset=${4 * offset} ${hbAt(j)}))
        (local.set $v ${DECIDE})
        (i32.store8 offset=${offset} (i32.add (local.get $next) ${j}) (local.get $v))
        (if (i32.ne (local.get $v) (local.get $si)) (then (local.set $same (i32.const 0))))`
  const group = `
        (local.set $need (i32.or (i32.or ${needs('(local.get $i)')} (i32.shl ${needs('(i32.add (local.get $i) (i32.const 1))')} (i32.const 1)))
          (i32.or (i32.shl ${needs('(i32.add (local.get $i) (i32.const 2))')} (i32.const 2)) (i32.shl ${needs('(i32.add (local.get $i) (i32.const 3))')} (i32.const 3)))))
        (if (i32.eq (local.get $need) (i32.const 15))
          (then
            (local.set $r0 (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
            (local.set $r1 (i32.add (local.get $r0) (local.get $pp)))
            (local.set $r2 (i32.add (local.get $r1) (local.get $pp)))
            (local.set $r3 (i32.add (local.get $r2) (local.get $pp)))
            ${dot4()}
            ${[0, 1, 2, 3].map((j) => `(i32.store offset=${4 * j} ${hbAt('(local.get $i)')} (i32.sub (local.get $h${j}) (i32.mul (local.get $self) (i32.load8_s offset=${j} (i32.add (local.get $s) (local.get $i))))))
            (f64.store offset=${8 * j} ${gbAt('(local.get $i)')} (local.get $G))`).join('\n            ')})
          (else
            ${[0, 1, 2, 3].map((j) => `(if (i32.and (local.get $need) (i32.const ${1 << j})) (then
              (local.set $j (i32.add (local.get $i) (i32.const ${j})))
              ${exactOne('(local.get $j)')}))`).join('\n            ')}))
        ${[0, 1, 2, 3].map((j) => decideAt('(local.get $i)', j)).join('')}`
  return `
  ${header('runSync16')}
    ${LOCALS} ${LOCALS4}
    (local $i i32) (local $j i32) (local $si i32) (local $v i32) (local $same i32) (local $check i32) (local $steps i32)
    (local $first i32) (local $need i32) (local $hv i32) (local $G f64) (local $acc v128) (local $mq i32) (local $me i32)
    (loop $trial
      (local.set $steps (i32.add (local.get $steps) (i32.const 1)))
      (local.set $check (i32.ge_u (local.get $steps) (i32.const 2)))
      (local.set $first (i32.eq (local.get $steps) (i32.const 1)))
      (block $step
        (local.set $same (i32.const 1))
        (local.set $i (i32.const 0))
        (block $groupsDone
          (loop $group
            (br_if $groupsDone (i32.gt_u (i32.add (local.get $i) (i32.const 4)) (local.get $n)))
            ${group}
            (local.set $i (i32.add (local.get $i) (i32.const 4)))
            (br $group)))
        (block $tailDone
          (loop $tail
            (br_if $tailDone (i32.ge_u (local.get $i) (local.get $n)))
            (if ${needs('(local.get $i)')} (then ${exactOne('(local.get $i)')}))
            ${decideAt('(local.get $i)', 0)}
            (local.set $i (i32.add (local.get $i) (i32.const 1)))
            (br $tail)))
        (br_if $step (local.get $same))
        ${TWO_CYCLE_CHECK}
        (memory.copy (local.get $mprev) (local.get $m) (i32.shl (local.get $pp) (i32.const 1)))
        (local.set $i (i32.const 0))
        (loop $apply
          (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
          (local.set $v (i32.load8_s (i32.add (local.get $next) (local.get $i))))
          (i32.store8 (i32.add (local.get $prev) (local.get $i)) (local.get $si))
          (if (i32.ne (local.get $v) (local.get $si))
            (then
              (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
              (local.set $delta (i32.sub (local.get $v) (local.get $si)))
              (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
              ${flip(16)}
              ;; Its self term moved: recompute it next step.
              (f64.store ${gbAt('(local.get $i)')} (f64.const -inf))))
          (br_if $apply (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
        ;; G += Σ_μ |m_μ − m'_μ| (widened to int32: a difference of two int16 overlaps may not fit int16).
        (local.set $acc (v128.const i32x4 0 0 0 0))
        (local.set $mq (i32.const 0))
        (local.set $me (i32.shl (local.get $pp) (i32.const 1)))
        (loop $norm
          (local.set $x (v128.load (i32.add (local.get $m) (local.get $mq))))
          (local.set $y (v128.load (i32.add (local.get $mprev) (local.get $mq))))
          (local.set $acc (i32x4.add (local.get $acc) (i32x4.abs (i32x4.sub (i32x4.extend_low_i16x8_s (local.get $x)) (i32x4.extend_low_i16x8_s (local.get $y))))))
          (local.set $acc (i32x4.add (local.get $acc) (i32x4.abs (i32x4.sub (i32x4.extend_high_i16x8_s (local.get $x)) (i32x4.extend_high_i16x8_s (local.get $y))))))
          (br_if $norm (i32.lt_u (local.tee $mq (i32.add (local.get $mq) (i32.const 16))) (local.get $me))))
        (local.set $G (f64.add (local.get $G) (f64.convert_i32_u (i32.add
          (i32.add (i32x4.extract_lane 0 (local.get $acc)) (i32x4.extract_lane 1 (local.get $acc)))
          (i32.add (i32x4.extract_lane 2 (local.get $acc)) (i32x4.extract_lane 3 (local.get $acc))))))))
      (br_if $trial (i32.and (i32.eqz (local.get $same)) (i32.lt_u (local.get $steps) (local.get $max)))))
    (i32.add (i32.shl (local.get $steps) (i32.const 2)) (local.get $same)))`
}

function runSync (w: Width): string {
  return `
  ${header(`runSync${w}`)}
    ${LOCALS}
    (local $i i32) (local $si i32) (local $v i32) (local $same i32) (local $check i32) (local $steps i32) ${w === 16 ? LOCALS4 : ''}
    (loop $trial
      (local.set $steps (i32.add (local.get $steps) (i32.const 1)))
      (local.set $check (i32.ge_u (local.get $steps) (i32.const 2)))
      ${syncBody(w)}
      (br_if $trial (i32.and (i32.eqz (local.get $same)) (i32.lt_u (local.get $steps) (local.get $max)))))
    (i32.add (i32.shl (local.get $steps) (i32.const 2)) (local.get $same)))`
}

/** m = Σ_i s_i ξ_i from scratch, int16 or int32 overlaps (xi neuron-major, rows of pp). */
function overlapsFunction (w: Width): string {
  const lane = w === 16 ? 2 : 4
  return `
  ;; m = Σ_i s_i ξ_i from scratch. ${w === 16 ? 'Groups of 64 patterns (one cache line of a row) then single blocks of 16' : 'One block of 16 patterns at a time'},
  ;; so the accumulators stay in registers and every cache line fetched is used whole.
  ${header(`overlaps${w}`)}
    (local $blk i32) (local $r i32) (local $sp i32) (local $se i32) (local $x v128) (local $y v128) (local $sv v128)
    (local $a v128) (local $b v128) (local $c v128) (local $d v128)
    (local $a4 v128) (local $a5 v128) (local $a6 v128) (local $a7 v128)
    (local.set $se (i32.add (local.get $s) (local.get $n)))
    (local.set $blk (i32.const 0))
    ${w === 16 ? overlapGroups16() : ''}
    (if (i32.lt_u (local.get $blk) (local.get $pp)) (then
    (loop $block
      (local.set $a (v128.const i32x4 0 0 0 0))
      (local.set $b (v128.const i32x4 0 0 0 0))
      (local.set $c (v128.const i32x4 0 0 0 0))
      (local.set $d (v128.const i32x4 0 0 0 0))
      (local.set $r (i32.add (local.get $xi) (local.get $blk)))
      (local.set $sp (local.get $s))
      (loop $neuron
        (local.set $x (v128.load (local.get $r)))
        ${w === 16
          ? `(local.set $sv (i16x8.splat (i32.load8_s (local.get $sp))))
        (local.set $a (i16x8.add (local.get $a) (i16x8.mul (i16x8.extend_low_i8x16_s (local.get $x)) (local.get $sv))))
        (local.set $b (i16x8.add (local.get $b) (i16x8.mul (i16x8.extend_high_i8x16_s (local.get $x)) (local.get $sv))))`
          : `(local.set $sv (i32x4.splat (i32.load8_s (local.get $sp))))
        (local.set $y (i16x8.extend_low_i8x16_s (local.get $x)))
        (local.set $a (i32x4.add (local.get $a) (i32x4.mul (i32x4.extend_low_i16x8_s (local.get $y)) (local.get $sv))))
        (local.set $b (i32x4.add (local.get $b) (i32x4.mul (i32x4.extend_high_i16x8_s (local.get $y)) (local.get $sv))))
        (local.set $y (i16x8.extend_high_i8x16_s (local.get $x)))
        (local.set $c (i32x4.add (local.get $c) (i32x4.mul (i32x4.extend_low_i16x8_s (local.get $y)) (local.get $sv))))
        (local.set $d (i32x4.add (local.get $d) (i32x4.mul (i32x4.extend_high_i16x8_s (local.get $y)) (local.get $sv))))`}
        (local.set $r (i32.add (local.get $r) (local.get $pp)))
        (br_if $neuron (i32.lt_u (local.tee $sp (i32.add (local.get $sp) (i32.const 1))) (local.get $se))))
      (local.set $r (i32.add (local.get $m) (i32.mul (local.get $blk) (i32.const ${lane}))))
      (v128.store (local.get $r) (local.get $a))
      (v128.store offset=16 (local.get $r) (local.get $b))
      ${w === 32 ? '(v128.store offset=32 (local.get $r) (local.get $c)) (v128.store offset=48 (local.get $r) (local.get $d))' : ''}
      (br_if $block (i32.lt_u (local.tee $blk (i32.add (local.get $blk) (i32.const 16))) (local.get $pp)))))))`
}

function variant (w: Width): string {
  return `
  ;; Raw field without the self term: Σ_μ ξ_i^μ m_μ.
  ${header(`dot${w}`)}
    ${LOCALS}
    (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
    ${dot(w)}
    (local.get $h))

  ;; m += delta·ξ_i (a change of s_i by delta).
  ${header(`flip${w}`)}
    ${LOCALS}
    (local.set $delta (local.get $d0))
    (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
    ${flip(w)})

  ;; One asynchronous zero-temperature sweep in the given order; returns 1 if any neuron changed.
  ${w === 16 ? sweep16Grouped() : sweepOne(w)}

  ;; One synchronous zero-temperature step s(t) = sign(h(s(t−1))), ties keep s_i.
  ;; Returns 1 if s(t) = s(t−1) (state left as is), 2 if s(t) = prev (checked when $check), else 0;
  ;; unless 1, prev ← s(t−1) and s, m ← s(t), m updated from the changed neurons only.
  ${header(`sync${w}`)}
    ${LOCALS}
    (local $i i32) (local $si i32) (local $v i32) (local $same i32) ${w === 16 ? LOCALS4 : ''}
    ${syncBody(w)}
    (local.get $same))

  ;; One asynchronous Glauber sweep: s_i ← +1 iff u_k·(1 + exp(factor·h_i)) < 1, u_k = noise[k].
  ;; The same IEEE operations, in the same order, as the plain path; exp is the host's Math.exp,
  ;; its values kept in the table over the integer field (see onePlusExp).
  ${header(`glauber${w}`)}
    ${LOCALS} ${TABLE_LOCALS}
    (local $k i32) (local $i i32) (local $si i32) (local $v i32)
    (local.set $k (i32.const 0))
    (loop $visit
      (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${dot(w)}
      (local.set $h (i32.sub (local.get $h) (i32.mul (local.get $self) (local.get $si))))
      ${onePlusExp('(local.get $h)')}
      (local.set $v (select (i32.const 1) (i32.const -1)
        (f64.lt (f64.mul (f64.load (i32.add (local.get $noise) (i32.shl (local.get $k) (i32.const 3)))) (local.get $g)) (f64.const 1))))
      (if (i32.ne (local.get $v) (local.get $si))
        (then
          (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
          (local.set $delta (i32.sub (local.get $v) (local.get $si)))
          ${flip(w)}))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n)))))

  ;; Synchronous Glauber step: next_i from the current state for every i, then s, m ← next.
  ${header(`glauberSync${w}`)}
    ${LOCALS} ${TABLE_LOCALS}
    (local $i i32) (local $si i32) (local $v i32)
    (local.set $i (i32.const 0))
    (loop $visit
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${dot(w)}
      (local.set $h (i32.sub (local.get $h) (i32.mul (local.get $self) (local.get $si))))
      ${onePlusExp('(local.get $h)')}
      (i32.store8 (i32.add (local.get $next) (local.get $i)) (select (i32.const 1) (i32.const -1)
        (f64.lt (f64.mul (f64.load (i32.add (local.get $noise) (i32.shl (local.get $i) (i32.const 3)))) (local.get $g)) (f64.const 1))))
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    (local.set $i (i32.const 0))
    (loop $apply
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $v (i32.load8_s (i32.add (local.get $next) (local.get $i))))
      (if (i32.ne (local.get $v) (local.get $si))
        (then
          (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
          (local.set $delta (i32.sub (local.get $v) (local.get $si)))
          (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
          ${flip(w)}))
      (br_if $apply (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n)))))`
}

/**
 * Pattern-major int8 (rows of np bytes, P padded to pp rows of zeros) to neuron-major
 * (rows of pp bytes), in 16×16 tiles: four rounds of byte interleaves of rows j and j+8
 * transpose a tile in registers (64 shuffles per 256 entries instead of 256 scalar moves).
 */
function transpose (): string {
  const lo = '0 16 1 17 2 18 3 19 4 20 5 21 6 22 7 23'
  const hi = '8 24 9 25 10 26 11 27 12 28 13 29 14 30 15 31'
  const decl: string[] = []
  for (let k = 0; k < 16; k++) decl.push(`(local $v${k} v128) (local $w${k} v128)`)
  const loads: string[] = []
  for (let r = 0; r < 16; r++) loads.push(`(local.set $v${r} (v128.load (i32.add (local.get $in) (i32.mul (i32.const ${r}) (local.get $srcStride)))))`)
  const rounds: string[] = []
  for (let round = 0; round < 4; round++) {
    const [from, to] = round % 2 === 0 ? ['v', 'w'] : ['w', 'v']
    for (let j = 0; j < 8; j++) {
      rounds.push(`(local.set $${to}${2 * j} (i8x16.shuffle ${lo} (local.get $${from}${j}) (local.get $${from}${j + 8})))`)
      rounds.push(`(local.set $${to}${2 * j + 1} (i8x16.shuffle ${hi} (local.get $${from}${j}) (local.get $${from}${j + 8})))`)
    }
  }
  const stores: string[] = []
  for (let c = 0; c < 16; c++) stores.push(`(v128.store (i32.add (local.get $out) (i32.mul (i32.const ${c}) (local.get $stride))) (local.get $v${c}))`)
  return `
  ;; dst[i·stride + μ] = src[μ·srcStride + i] for i < cols, μ < rows (cols, rows multiples of 16).
  ${header('transpose')}
    (local $ti i32) (local $tm i32) (local $in i32) (local $out i32)
    ${decl.join(' ')}
    (local.set $ti (i32.const 0))
    (loop $tiles
      (local.set $tm (i32.const 0))
      (loop $rows
        (local.set $in (i32.add (local.get $src) (i32.add (i32.mul (local.get $tm) (local.get $srcStride)) (local.get $ti))))
        (local.set $out (i32.add (local.get $dst) (i32.add (i32.mul (local.get $ti) (local.get $stride)) (local.get $tm))))
        ${loads.join('\n        ')}
        ${rounds.join('\n        ')}
        ${stores.join('\n        ')}
        (br_if $rows (i32.lt_u (local.tee $tm (i32.add (local.get $tm) (i32.const 16))) (local.get $rows))))
      (br_if $tiles (i32.lt_u (local.tee $ti (i32.add (local.get $ti) (i32.const 16))) (local.get $cols)))))`
}

/**
 * xoshiro256** (Blackman & Vigna 2021) on native 64-bit words, for the per-sweep Fisher–Yates
 * shuffle: for i = n−1 down to 1, j = below(i + 1) = ⌊next()·(i + 1) / 2^64⌋, swap order[i],
 * order[j]. ⌊x·k / 2^64⌋ for k < 2^32 is computed exactly from the 32-bit halves of x:
 * (x_hi·k + ⌊x_lo·k / 2^32⌋) / 2^32 never exceeds 64 bits. The state (four words s0..s3,
 * little-endian) is read from and written back to `state`; the last output goes to state+32.
 */
function shuffle (): string {
  return `
  ${header('shuffle')}
    (local $s0 i64) (local $s1 i64) (local $s2 i64) (local $s3 i64) (local $t i64) (local $x i64)
    (local $i i32) (local $j i32) (local $pi i32) (local $pj i32) (local $tmp i32)
    (if (i32.lt_u (local.get $n) (i32.const 2)) (then (return)))
    ${XOSHIRO_LOAD}
    (local.set $i (i32.sub (local.get $n) (i32.const 1)))
    (loop $draw
      ${XOSHIRO_NEXT}
      (local.set $t (i64.extend_i32_u (i32.add (local.get $i) (i32.const 1))))
      (local.set $j ${BELOW_T})
      (local.set $pi (i32.add (local.get $order) (i32.shl (local.get $i) (i32.const 2))))
      (local.set $pj (i32.add (local.get $order) (i32.shl (local.get $j) (i32.const 2))))
      (local.set $tmp (i32.load (local.get $pi)))
      (i32.store (local.get $pi) (i32.load (local.get $pj)))
      (i32.store (local.get $pj) (local.get $tmp))
      (br_if $draw (local.tee $i (i32.sub (local.get $i) (i32.const 1)))))
    ${XOSHIRO_STORE})`
}

/**
 * The cue's choice of `count` distinct neurons out of n (n ≥ 1): idx = identity, then a partial
 * Fisher–Yates pass, for k = 0 .. count−1, j = k + below(n − k), swap idx[k], idx[j] — the plain loop of
 * dynamics/cue.ts, drawn from the xoshiro256** state at `state` (as "shuffle"). A cold
 * JavaScript process spends most of a short trial's cue in the interpreter's 64-bit draws;
 * here each draw is a few native instructions from the first call on.
 */
function partialShuffle (): string {
  return `
  ${header('partialShuffle')}
    (local $s0 i64) (local $s1 i64) (local $s2 i64) (local $s3 i64) (local $t i64) (local $x i64)
    (local $k i32) (local $j i32) (local $pk i32) (local $pj i32) (local $tmp i32)
    (loop $identity
      (i32.store (i32.add (local.get $idx) (i32.shl (local.get $k) (i32.const 2))) (local.get $k))
      (br_if $identity (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n))))
    (if (i32.eqz (local.get $count)) (then (return)))
    (local.set $k (i32.const 0))
    ${XOSHIRO_LOAD}
    (loop $draw
      ${XOSHIRO_NEXT}
      (local.set $t (i64.extend_i32_u (i32.sub (local.get $n) (local.get $k))))
      (local.set $j (i32.add (local.get $k) ${BELOW_T}))
      (local.set $pk (i32.add (local.get $idx) (i32.shl (local.get $k) (i32.const 2))))
      (local.set $pj (i32.add (local.get $idx) (i32.shl (local.get $j) (i32.const 2))))
      (local.set $tmp (i32.load (local.get $pj)))
      (i32.store (local.get $pj) (i32.load (local.get $pk)))
      (i32.store (local.get $pk) (local.get $tmp))
      (br_if $draw (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $count))))
    ${XOSHIRO_STORE})

  ;; The cue's bits once chosen ("partialShuffle"): s[idx[k]] for k < count negated, or set to 0 when $zero.
  ${header('markChosen')}
    (local $k i32) (local $p i32)
    (block $done
      (loop $mark
        (br_if $done (i32.ge_u (local.get $k) (local.get $count)))
        (local.set $p (i32.add (local.get $s) (i32.load (i32.add (local.get $idx) (i32.shl (local.get $k) (i32.const 2))))))
        (i32.store8 (local.get $p) (select (i32.const 0) (i32.sub (i32.const 0) (i32.load8_s (local.get $p))) (local.get $zero)))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $mark))))`
}

/**
 * Initial overlaps by bit counting. For ±1 entries, ξ^μ·s = N − 2·(number of entries where
 * they differ), and with both packed as sign bits (1 for −1) that count is popcount(ξ^μ XOR s):
 * N/64 popcounts per pattern instead of N multiply-adds. "packSigns" packs 16 entries per
 * i8x16.bitmask, zeroes the bits past n (so padding never differs) and reports an entry 0,
 * an erased cue bit, for which the identity fails and the caller uses the multiply-add
 * kernel. The patterns are packed once per network ("packRows", pattern-major, `words`
 * 64-bit words per row); "overlapsBits" packs the state, writes m_μ for μ < p as int16 or
 * int32 ($wide) and 0 for the padding patterns up to $pp, and returns 0 without writing
 * anything when the state holds a 0.
 */
function signBits (): string {
  const store = (value: string): string => `(if (local.get $wide)
        (then (i32.store (i32.add (local.get $m) (i32.shl (local.get $mu) (i32.const 2))) ${value}))
        (else (i32.store16 (i32.add (local.get $m) (i32.shl (local.get $mu) (i32.const 1))) ${value})))`
  return `
  ${header('packSigns', '$packSigns')}
    (local $k i32) (local $groups i32) (local $all i32) (local $v v128) (local $zero i32) (local $valid i32)
    (local.set $groups (i32.shr_u (i32.add (local.get $n) (i32.const 15)) (i32.const 4)))
    (local.set $all (i32.shl (local.get $words) (i32.const 2)))
    (block $done
      (loop $group
        (br_if $done (i32.ge_u (local.get $k) (local.get $all)))
        (if (i32.lt_u (local.get $k) (local.get $groups))
          (then
            (local.set $v (v128.load (i32.add (local.get $src) (i32.shl (local.get $k) (i32.const 4)))))
            (local.set $valid (select
              (i32.const 0xffff)
              (i32.sub (i32.shl (i32.const 1) (i32.and (local.get $n) (i32.const 15))) (i32.const 1))
              (i32.or (i32.lt_u (i32.add (local.get $k) (i32.const 1)) (local.get $groups)) (i32.eqz (i32.and (local.get $n) (i32.const 15))))))
            (local.set $zero (i32.or (local.get $zero) (i32.and (i8x16.bitmask (i8x16.eq (local.get $v) (v128.const i32x4 0 0 0 0))) (local.get $valid))))
            (i32.store16 (i32.add (local.get $dst) (i32.shl (local.get $k) (i32.const 1))) (i32.and (i8x16.bitmask (local.get $v)) (local.get $valid))))
          (else (i32.store16 (i32.add (local.get $dst) (i32.shl (local.get $k) (i32.const 1))) (i32.const 0))))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $group)))
    (i32.ne (local.get $zero) (i32.const 0)))

  ${header('packRows')}
    (local $r i32)
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $r) (local.get $rows)))
        (drop (call $packSigns
          (i32.add (local.get $src) (i32.mul (local.get $r) (local.get $n)))
          (local.get $n)
          (i32.add (local.get $dst) (i32.mul (local.get $r) (i32.shl (local.get $words) (i32.const 3))))
          (local.get $words)))
        (local.set $r (i32.add (local.get $r) (i32.const 1)))
        (br $row))))

  ${header('overlapsBits')}
    (local $mu i32) (local $w i32) (local $acc i64) (local $row i32)
    (if (call $packSigns (local.get $s) (local.get $n) (local.get $sbits) (local.get $words)) (then (return (i32.const 0))))
    (local.set $row (local.get $bits))
    (block $done
      (loop $pattern
        (br_if $done (i32.ge_u (local.get $mu) (local.get $p)))
        (local.set $acc (i64.const 0))
        (local.set $w (i32.const 0))
        (loop $word
          (local.set $acc (i64.add (local.get $acc) (i64.popcnt (i64.xor
            (i64.load (i32.add (local.get $row) (i32.shl (local.get $w) (i32.const 3))))
            (i64.load (i32.add (local.get $sbits) (i32.shl (local.get $w) (i32.const 3))))))))
          (br_if $word (i32.lt_u (local.tee $w (i32.add (local.get $w) (i32.const 1))) (local.get $words))))
        ${store('(i32.sub (local.get $n) (i32.shl (i32.wrap_i64 (local.get $acc)) (i32.const 1)))')}
        (local.set $row (i32.add (local.get $row) (i32.shl (local.get $words) (i32.const 3))))
        (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
        (br $pattern)))
    (block $padded
      (loop $pad
        (br_if $padded (i32.ge_u (local.get $mu) (local.get $pp)))
        ${store('(i32.const 0)')}
        (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
        (br $pad)))
    (i32.const 1))`
}

/**
 * `count` uniform doubles in [0, 1) from the xoshiro256** state at `state` (as "shuffle"):
 * the top 53 bits of each output times 2^−53, exactly the engine's `uniform()`.
 */
function uniforms (): string {
  return `
  ${header('uniforms')}
    (local $s0 i64) (local $s1 i64) (local $s2 i64) (local $s3 i64) (local $t i64) (local $x i64) (local $e i32)
    (if (i32.eqz (local.get $count)) (then (return)))
    ${XOSHIRO_LOAD}
    (local.set $e (i32.add (local.get $out) (i32.shl (local.get $count) (i32.const 3))))
    (loop $draw
      ${XOSHIRO_NEXT}
      (f64.store (local.get $out) (f64.mul (f64.convert_i64_u (i64.shr_u (local.get $x) (i64.const 11))) (f64.const 0x1p-53)))
      (br_if $draw (i32.lt_u (local.tee $out (i32.add (local.get $out) (i32.const 8))) (local.get $e))))
    ${XOSHIRO_STORE})`
}

/** The generator state at $state (four little-endian words) into locals $s0..$s3. */
const XOSHIRO_LOAD = `(local.set $s0 (i64.load (local.get $state)))
    (local.set $s1 (i64.load offset=8 (local.get $state)))
    (local.set $s2 (i64.load offset=16 (local.get $state)))
    (local.set $s3 (i64.load offset=24 (local.get $state)))`

/** Locals $s0..$s3 back to $state, and the last output $x after them (the engine's `word`). */
const XOSHIRO_STORE = `(i64.store (local.get $state) (local.get $s0))
    (i64.store offset=8 (local.get $state) (local.get $s1))
    (i64.store offset=16 (local.get $state) (local.get $s2))
    (i64.store offset=24 (local.get $state) (local.get $s3))
    (i64.store offset=32 (local.get $state) (local.get $x))`

/** below(t) = ⌊x·t / 2^64⌋ for the output $x and a bound $t < 2^32 (i64), exact from the 32-bit halves of x. */
const BELOW_T = `(i32.wrap_i64 (i64.shr_u
        (i64.add
          (i64.mul (i64.shr_u (local.get $x) (i64.const 32)) (local.get $t))
          (i64.shr_u (i64.mul (i64.and (local.get $x) (i64.const 0xffffffff)) (local.get $t)) (i64.const 32)))
        (i64.const 32)))`

/** One xoshiro256** step on locals $s0..$s3, leaving the output in $x (uses $t). */
const XOSHIRO_NEXT = `
      (local.set $x (i64.mul (i64.rotl (i64.mul (local.get $s1) (i64.const 5)) (i64.const 7)) (i64.const 9)))
      (local.set $t (i64.shl (local.get $s1) (i64.const 17)))
      (local.set $s2 (i64.xor (local.get $s2) (local.get $s0)))
      (local.set $s3 (i64.xor (local.get $s3) (local.get $s1)))
      (local.set $s1 (i64.xor (local.get $s1) (local.get $s2)))
      (local.set $s0 (i64.xor (local.get $s0) (local.get $s3)))
      (local.set $s2 (i64.xor (local.get $s2) (local.get $t)))
      (local.set $s3 (i64.rotl (local.get $s3) (i64.const 45)))`

/**
 * Unbiased ±1 patterns, pattern-major: for each of `count` rows of n entries, one 64-bit
 * draw per 64 entries, bit k → entry k (1 → +1, 0 → −1), each row starting a fresh draw.
 * 16 bits become 16 bytes by a byte swizzle, a per-lane bit mask and a compare. A short last
 * block still writes 64 bytes; the next row overwrites them and the caller leaves 64 bytes
 * of slack after the last row.
 */
function unbiasedRows (): string {
  const expand = (q: number): string => `
        (local.set $v (v128.and (i8x16.swizzle (local.get $w) (v128.const i8x16 ${2 * q} ${2 * q} ${2 * q} ${2 * q} ${2 * q} ${2 * q} ${2 * q} ${2 * q} ${2 * q + 1} ${2 * q + 1} ${2 * q + 1} ${2 * q + 1} ${2 * q + 1} ${2 * q + 1} ${2 * q + 1} ${2 * q + 1})) (local.get $bits)))
        (v128.store offset=${16 * q} (local.get $p) (i8x16.sub (v128.and (i8x16.eq (local.get $v) (local.get $bits)) (local.get $two)) (local.get $one)))`
  return `
  ${header('unbiasedRows')}
    (local $s0 i64) (local $s1 i64) (local $s2 i64) (local $s3 i64) (local $t i64) (local $x i64)
    (local $row i32) (local $p i32) (local $e i32) (local $w v128) (local $v v128) (local $bits v128) (local $two v128) (local $one v128)
    (if (i32.eqz (i32.mul (local.get $n) (local.get $count))) (then (return)))
    (local.set $bits (v128.const i8x16 1 2 4 8 16 32 64 128 1 2 4 8 16 32 64 128))
    (local.set $two (i8x16.splat (i32.const 2)))
    (local.set $one (i8x16.splat (i32.const 1)))
    ${XOSHIRO_LOAD}
    (local.set $row (i32.const 0))
    (loop $rows
      (local.set $p (i32.add (local.get $out) (i32.mul (local.get $row) (local.get $n))))
      (local.set $e (i32.add (local.get $p) (local.get $n)))
      (loop $words
        ${XOSHIRO_NEXT}
        (local.set $w (i64x2.splat (local.get $x)))
        ${[0, 1, 2, 3].map(expand).join('')}
        (br_if $words (i32.lt_u (local.tee $p (i32.add (local.get $p) (i32.const 64))) (local.get $e))))
      (br_if $rows (i32.lt_u (local.tee $row (i32.add (local.get $row) (i32.const 1))) (local.get $count))))
    ${XOSHIRO_STORE})`
}

/**
 * Dense float64 kernels: h[0..n) += c·col[0..n) two lanes at a time (f64x2), with a scalar
 * tail for odd n. Each element sees exactly the scalar operations h + (col·c), in the same
 * order, so the results equal the plain loops bit for bit (no fused multiply-add in wasm).
 * Uses locals $hp $cp $he $cv.
 */
function axpy (col: string, coef: string): string {
  return `
    (local.set $hp (local.get $h))
    (local.set $cp ${col})
    (local.set $he (i32.add (local.get $h) (i32.shl (i32.and (local.get $n) (i32.const -2)) (i32.const 3))))
    (local.set $cv (f64x2.splat ${coef}))
    (if (i32.lt_u (local.get $hp) (local.get $he))
      (then
        (loop $axpy
          (v128.store (local.get $hp) (f64x2.add (v128.load (local.get $hp)) (f64x2.mul (v128.load (local.get $cp)) (local.get $cv))))
          (local.set $cp (i32.add (local.get $cp) (i32.const 16)))
          (br_if $axpy (i32.lt_u (local.tee $hp (i32.add (local.get $hp) (i32.const 16))) (local.get $he))))))
    (if (i32.and (local.get $n) (i32.const 1))
      (then (f64.store (local.get $hp) (f64.add (f64.load (local.get $hp)) (f64.mul (f64.load (local.get $cp)) ${coef})))))`
}

const DENSE_LOCALS = '(local $hp i32) (local $cp i32) (local $he i32) (local $cv v128) (local $k i32) (local $i i32) (local $si i32) (local $v i32) (local $f f64)'

/** Column j of the n×n column-major coupling array starts at cols + 8·n·j. */
const COLUMN = (j: string): string => `(i32.add (local.get $cols) (i32.mul (i32.shl (local.get $n) (i32.const 3)) ${j}))`

function dense (): string {
  // h = bias + Σ_j J_ij s_j, j ascending: the plain row loop's order for every element. With
  // $rowwise the array is read as rows (a matrix declared symmetric that is not exactly so:
  // the plain path builds fields from rows and updates them from the same array as columns);
  // otherwise as exact columns, two rows at a time.
  const reload = `
    (if (local.get $rowwise)
      (then
        (local.set $i (i32.const 0))
        (loop $row
          (local.set $f (f64.load (i32.add (local.get $bias) (i32.shl (local.get $i) (i32.const 3)))))
          (local.set $cp ${COLUMN('(local.get $i)')})
          (local.set $k (i32.const 0))
          (loop $el
            (local.set $f (f64.add (local.get $f) (f64.mul (f64.load (i32.add (local.get $cp) (i32.shl (local.get $k) (i32.const 3)))) (f64.convert_i32_s (i32.load8_s (i32.add (local.get $s) (local.get $k)))))))
            (br_if $el (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n))))
          (f64.store (i32.add (local.get $h) (i32.shl (local.get $i) (i32.const 3))) (local.get $f))
          (br_if $row (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n)))))
      (else
        (memory.copy (local.get $h) (local.get $bias) (i32.shl (local.get $n) (i32.const 3)))
        (local.set $k (i32.const 0))
        (loop $col
          ${axpy(COLUMN('(local.get $k)'), '(f64.convert_i32_s (i32.load8_s (i32.add (local.get $s) (local.get $k))))')}
          (br_if $col (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n))))))`
  const change = `
        (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
        ${axpy(COLUMN('(local.get $i)'), '(f64.convert_i32_s (i32.sub (local.get $v) (local.get $si)))')}`
  const field = '(f64.load (i32.add (local.get $h) (i32.shl (local.get $i) (i32.const 3))))'
  const glauberUp = (noiseIndex: string): string => `(select (i32.const 1) (i32.const -1)
          (f64.lt
            (f64.mul (f64.load (i32.add (local.get $noise) (i32.shl ${noiseIndex} (i32.const 3))))
              (f64.add (f64.const 1) (call $exp (f64.mul (local.get $factor) ${field}))))
            (f64.const 1)))`
  return `
  ;; Dense: h = bias + J s from scratch (cols[j·n + i] = J_ij).
  ${header('denseLoad')}
    ${DENSE_LOCALS}
    ${reload})

  ;; Dense zero-temperature asynchronous sweep; returns 1 if any neuron changed.
  ${header('denseSweep')}
    ${DENSE_LOCALS} (local $changed i32) (local $fh f64)
    (local.set $k (i32.const 0))
    (loop $visit
      (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $fh ${field})
      (local.set $v (select (i32.const 1) (select (i32.const -1) (local.get $si) (f64.lt (local.get $fh) (f64.const 0))) (f64.gt (local.get $fh) (f64.const 0))))
      (if (i32.ne (local.get $v) (local.get $si))
        (then ${change}
          (local.set $changed (i32.const 1))))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n))))
    (local.get $changed))

  ;; Dense asynchronous Glauber sweep, noise[k] the uniform of the k-th visit.
  ${header('denseGlauber')}
    ${DENSE_LOCALS}
    (local.set $k (i32.const 0))
    (loop $visit
      (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $v ${glauberUp('(local.get $k)')})
      (if (i32.ne (local.get $v) (local.get $si)) (then ${change}))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n)))))

  ;; Dense synchronous zero-temperature step (same contract as sync16), then h reloaded from scratch.
  ${header('denseSync')}
    ${DENSE_LOCALS} (local $same i32) (local $fh f64)
    (local.set $same (i32.const 1))
    (local.set $i (i32.const 0))
    (loop $visit
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $fh ${field})
      (local.set $v (select (i32.const 1) (select (i32.const -1) (local.get $si) (f64.lt (local.get $fh) (f64.const 0))) (f64.gt (local.get $fh) (f64.const 0))))
      (i32.store8 (i32.add (local.get $next) (local.get $i)) (local.get $v))
      (if (i32.ne (local.get $v) (local.get $si)) (then (local.set $same (i32.const 0))))
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    (if (local.get $same) (then (return (i32.const 1))))
    ${TWO_CYCLE_CHECK}
    (memory.copy (local.get $prev) (local.get $s) (local.get $n))
    (memory.copy (local.get $s) (local.get $next) (local.get $n))
    ${reload}
    (local.get $same))

  ;; Dense synchronous Glauber step: next_i from h_i and noise[i], then s ← next and h reloaded.
  ${header('denseGlauberSync')}
    ${DENSE_LOCALS}
    (local.set $i (i32.const 0))
    (loop $visit
      (i32.store8 (i32.add (local.get $next) (local.get $i)) ${glauberUp('(local.get $i)')})
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    (memory.copy (local.get $s) (local.get $next) (local.get $n))
    ${reload})`
}

/**
 * Dense int16 kernels, for integer couplings (|J| ≤ 32767: Hebbian on 0/1 neurons, dilution
 * that keeps 1 in k): columns as int16 rows of `stride` entries (n rounded up to 8, zero
 * padded), fields h and bias as exact int32. A change adds delta·J_·j eight lanes at a time; a
 * field build is one int16 dot product per neuron when the rows are the columns (a matrix
 * symmetric bit for bit), else column by column. Integer sums are exact in any order, so the
 * fields equal the plain float64 ones (whose integer-valued sums are exact as well).
 * Column j starts at cols + 2·stride·j; the axpy uses locals $hp $cp $he $cv.
 */
const COLUMN16 = (j: string): string => `(i32.add (local.get $cols) (i32.mul (i32.shl (local.get $stride) (i32.const 1)) ${j}))`

function axpy16 (col: string, coef: string): string {
  return `
    (local.set $hp (local.get $h))
    (local.set $cp ${col})
    (local.set $he (i32.add (local.get $h) (i32.shl (local.get $stride) (i32.const 2))))
    (local.set $cv (i32x4.splat ${coef}))
    (loop $axpy
      (local.set $x (v128.load (local.get $cp)))
      (v128.store (local.get $hp) (i32x4.add (v128.load (local.get $hp)) (i32x4.mul (i32x4.extend_low_i16x8_s (local.get $x)) (local.get $cv))))
      (v128.store offset=16 (local.get $hp) (i32x4.add (v128.load offset=16 (local.get $hp)) (i32x4.mul (i32x4.extend_high_i16x8_s (local.get $x)) (local.get $cv))))
      (local.set $cp (i32.add (local.get $cp) (i32.const 16)))
      (br_if $axpy (i32.lt_u (local.tee $hp (i32.add (local.get $hp) (i32.const 32))) (local.get $he))))`
}

const DENSE16_LOCALS = '(local $hp i32) (local $cp i32) (local $he i32) (local $cv v128) (local $x v128) (local $acc v128) (local $k i32) (local $i i32) (local $si i32) (local $v i32) (local $fh i32)'

function dense16 (): string {
  // s16 ← s, then h = bias + J s (dot products of rows with s16, or column by column).
  const reload = `
    (local.set $i (i32.const 0))
    (loop $widen
      (i32.store16 (i32.add (local.get $s16) (i32.shl (local.get $i) (i32.const 1))) (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (br_if $widen (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    (if (local.get $rowsAreColumns)
      (then
        (local.set $i (i32.const 0))
        (loop $row
          (local.set $acc (v128.const i32x4 0 0 0 0))
          (local.set $cp ${COLUMN16('(local.get $i)')})
          (local.set $hp (local.get $s16))
          (local.set $he (i32.add (local.get $s16) (i32.shl (local.get $stride) (i32.const 1))))
          (loop $dot
            (local.set $acc (i32x4.add (local.get $acc) (i32x4.dot_i16x8_s (v128.load (local.get $cp)) (v128.load (local.get $hp)))))
            (local.set $cp (i32.add (local.get $cp) (i32.const 16)))
            (br_if $dot (i32.lt_u (local.tee $hp (i32.add (local.get $hp) (i32.const 16))) (local.get $he))))
          (i32.store (i32.add (local.get $h) (i32.shl (local.get $i) (i32.const 2)))
            (i32.add (i32.load (i32.add (local.get $bias) (i32.shl (local.get $i) (i32.const 2))))
              (i32.add
                (i32.add (i32x4.extract_lane 0 (local.get $acc)) (i32x4.extract_lane 1 (local.get $acc)))
                (i32.add (i32x4.extract_lane 2 (local.get $acc)) (i32x4.extract_lane 3 (local.get $acc))))))
          (br_if $row (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n)))))
      (else
        (memory.copy (local.get $h) (local.get $bias) (i32.shl (local.get $stride) (i32.const 2)))
        (local.set $k (i32.const 0))
        (loop $col
          (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $k))))
          (if (local.get $si) (then ${axpy16(COLUMN16('(local.get $k)'), '(local.get $si)')}))
          (br_if $col (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n))))))`
  const change = `
        (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
        ${axpy16(COLUMN16('(local.get $i)'), '(i32.sub (local.get $v) (local.get $si))')}`
  const field = '(i32.load (i32.add (local.get $h) (i32.shl (local.get $i) (i32.const 2))))'
  const decide = '(select (i32.const 1) (select (i32.const -1) (local.get $si) (i32.lt_s (local.get $fh) (i32.const 0))) (i32.gt_s (local.get $fh) (i32.const 0)))'
  // Leaves 1 + exp(factor·h_i) in $g (tabulated over the integer field), then decides.
  const glauberUp = (noiseIndex: string): string => `(block (result i32)
          (local.set $fh ${field})
          ${onePlusExp('(local.get $fh)')}
          (select (i32.const 1) (i32.const -1)
            (f64.lt (f64.mul (f64.load (i32.add (local.get $noise) (i32.shl ${noiseIndex} (i32.const 3)))) (local.get $g)) (f64.const 1))))`
  return `
  ;; Dense int16: h = bias + J s from scratch.
  ${header('dense16Load')}
    ${DENSE16_LOCALS}
    ${reload})

  ;; Dense int16: s_j changes by delta (the per-neuron set of the JavaScript API).
  ${header('dense16Set')}
    ${DENSE16_LOCALS}
    ${axpy16(COLUMN16('(local.get $j)'), '(local.get $delta)')})

  ;; Dense int16 zero-temperature asynchronous sweep; returns 1 if any neuron changed.
  ${header('dense16Sweep')}
    ${DENSE16_LOCALS} (local $changed i32)
    (local.set $k (i32.const 0))
    (loop $visit
      (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $fh ${field})
      (local.set $v ${decide})
      (if (i32.ne (local.get $v) (local.get $si))
        (then ${change}
          (local.set $changed (i32.const 1))))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n))))
    (local.get $changed))

  ;; Dense int16 asynchronous Glauber sweep, noise[k] the uniform of the k-th visit.
  ${header('dense16Glauber')}
    ${DENSE16_LOCALS} ${TABLE_LOCALS}
    (local.set $k (i32.const 0))
    (loop $visit
      (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $v ${glauberUp('(local.get $k)')})
      (if (i32.ne (local.get $v) (local.get $si)) (then ${change}))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n)))))

  ;; Dense int16 synchronous zero-temperature step (contract of sync16), then h rebuilt.
  ${header('dense16Sync')}
    ${DENSE16_LOCALS} (local $same i32)
    (local.set $same (i32.const 1))
    (local.set $i (i32.const 0))
    (loop $visit
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $fh ${field})
      (local.set $v ${decide})
      (i32.store8 (i32.add (local.get $next) (local.get $i)) (local.get $v))
      (if (i32.ne (local.get $v) (local.get $si)) (then (local.set $same (i32.const 0))))
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    (if (local.get $same) (then (return (i32.const 1))))
    ${TWO_CYCLE_CHECK}
    (memory.copy (local.get $prev) (local.get $s) (local.get $n))
    (memory.copy (local.get $s) (local.get $next) (local.get $n))
    ${reload}
    (local.get $same))

  ;; Dense int16 synchronous Glauber step: next_i from h_i and noise[i], then s ← next and h rebuilt.
  ${header('dense16GlauberSync')}
    ${DENSE16_LOCALS} ${TABLE_LOCALS}
    (local.set $i (i32.const 0))
    (loop $visit
      (i32.store8 (i32.add (local.get $next) (local.get $i)) ${glauberUp('(local.get $i)')})
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    (memory.copy (local.get $s) (local.get $next) (local.get $n))
    ${reload})`
}

/**
 * Dense associative memories (network/dense-memory.ts), ±1 neurons, raw field
 * h_i = Σ_μ ξ_i^μ D(r_μ), r_μ = m_μ − ξ_i^μ s_i, read there from a table over the integers.
 *
 * ## Why this shape
 * The plain visit gathers P table entries and adds them in order: P dependent additions. For
 * s_i = ±1, write t_μ = ξ_i^μ s_i; then ξ_i^μ D(r_μ) is s_i·A_μ where t_μ = 1 and −s_i·B_μ where
 * t_μ = −1, with A_μ = D(m_μ − 1), B_μ = D(m_μ + 1), so
 *   h_i = ½ [ s_i Σ_μ (A_μ − B_μ) + Σ_μ ξ_i^μ C_μ ],   C_μ = A_μ + B_μ:
 * the vector C depends on the overlaps only (rebuilt after a change, which rewrites every m_μ
 * anyway), and a visit is a masked sum Σ_μ ξ_i^μ C_μ = ΣC − 2 Σ_{ξ_i^μ = −1} C_μ, two float64
 * lanes per SIMD operation, the masks expanded from the int8 pattern row by byte swizzles.
 * - Polynomial: D(r) = (r+1)ⁿ − (r−1)ⁿ is an integer. The network runs this kernel only when
 *   every sum involved is an integer below 2⁵³ (4·P·max|D| < 2⁵³), where float64 addition is
 *   exact in any order: the field is the plain path's integer, bit for bit, at any temperature.
 * - Exponential: D(r) ∝ eʳ, and the plain field Σ_μ ξ e^{r_μ − R} (R = max r) is a rounded
 *   sequential sum. With E_μ = e^{m_μ − M'} (M' = max m + 1, table values) and S = ΣE, the same
 *   algebra gives h ∝ G = (S − 2 Σ_{ξ=−1} E) − s_i·S·tanh 1 with a positive factor, so the sign
 *   of G is the sign of the exact field. Both G and the plain sum are within a few P ulps of S
 *   of their exact values, so where |G| > τ = (16P + 64)·2⁻⁵³·S + P·2⁻¹⁰⁶⁰ (over twice the two
 *   error bounds together) G's sign is the plain field's sign, and the decision is the plain
 *   decision. Where |G| ≤ τ (ties, near-ties) the kernel computes the plain field itself, in the
 *   plain order with the plain table. Zero temperature only (the model allows no other).
 * Where s_i = 0 (erased cue bits) the polynomial visit also computes the plain field directly.
 *
 * Layout: xi neuron-major int8 rows of pp (P rounded up to 16, zero padded; the overlap-space
 * layout, so overlaps32 and the flip32 update serve here too), m int32 (pp lanes), c float64
 * (pp), sums float64 ×2 (polynomial: Σ(A−B), ΣC; exponential: S, τ), table float64:
 * polynomial D(r) at r + off (off = N + 1, r ∈ [−N−1, N+1]), exponential e^{−d} at d ∈ [0, 2N+1].
 */
type MemoryKind = 'Poly' | 'Exp'

const MEM_LOCALS = `(local $row i32) (local $r i32) (local $e i32) (local $mp i32) (local $delta i32) (local $x v128) (local $y v128) (local $dv v128)
    (local $vp i32) (local $nm v128) (local $q0 v128) (local $q1 v128) (local $q2 v128) (local $q3 v128) (local $neg f64) (local $f f64)
    (local $mu i32) (local $xv i32) (local $top i32) (local $rr i32) (local $k0 f64) (local $k1 f64) (local $k i32) (local $i i32) (local $si i32) (local $v i32)`

/** Σ_{μ: ξ_row^μ = −1} vec_μ into $neg: the row's sign bytes widened to 64-bit lane masks by swizzles. */
function maskedSum (): string {
  const lanes: string[] = []
  for (let q = 0; q < 8; q++) {
    const index = `${Array(8).fill(2 * q).join(' ')} ${Array(8).fill(2 * q + 1).join(' ')}`
    lanes.push(`(local.set $q${q % 4} (f64x2.add (local.get $q${q % 4}) (v128.and (i8x16.swizzle (local.get $nm) (v128.const i8x16 ${index})) (v128.load offset=${16 * q} (local.get $vp)))))`)
  }
  return `
      (local.set $r (local.get $row))
      (local.set $e (i32.add (local.get $row) (local.get $pp)))
      (local.set $vp (local.get $vec))
      (local.set $q0 (v128.const i32x4 0 0 0 0))
      (local.set $q1 (v128.const i32x4 0 0 0 0))
      (local.set $q2 (v128.const i32x4 0 0 0 0))
      (local.set $q3 (v128.const i32x4 0 0 0 0))
      (loop $masked
        (local.set $nm (i8x16.lt_s (v128.load (local.get $r)) (v128.const i32x4 0 0 0 0)))
        ${lanes.join('\n        ')}
        (local.set $vp (i32.add (local.get $vp) (i32.const 128)))
        (br_if $masked (i32.lt_u (local.tee $r (i32.add (local.get $r) (i32.const 16))) (local.get $e))))
      (local.set $q0 (f64x2.add (f64x2.add (local.get $q0) (local.get $q1)) (f64x2.add (local.get $q2) (local.get $q3))))
      (local.set $neg (f64.add (f64x2.extract_lane 0 (local.get $q0)) (f64x2.extract_lane 1 (local.get $q0))))`
}

const M_AT = (mu: string): string => `(i32.load (i32.add (local.get $m) (i32.shl ${mu} (i32.const 2))))`
const ROW_AT = (mu: string): string => `(i32.load8_s (i32.add (local.get $row) ${mu}))`

/** The plain path's field, in its order, into $f: Σ_μ ξ·D(m_μ − ξ s_i) (polynomial table at r + off). */
const EXACT_POLY = `
      (local.set $f (f64.const 0))
      (local.set $mu (i32.const 0))
      (block $exactDone
        (loop $exact
          (br_if $exactDone (i32.ge_u (local.get $mu) (local.get $p)))
          (local.set $xv ${ROW_AT('(local.get $mu)')})
          (local.set $f (f64.add (local.get $f) (f64.mul (f64.convert_i32_s (local.get $xv))
            (f64.load (i32.add (local.get $table) (i32.shl (i32.add (i32.sub ${M_AT('(local.get $mu)')} (i32.mul (local.get $xv) (local.get $si))) (local.get $off)) (i32.const 3)))))))
          (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
          (br $exact)))`

/** The plain path's exponential field into $f: R = max_μ r_μ, then Σ_μ ξ·e^{−(R − r_μ)} in order. */
const EXACT_EXP = `
      (local.set $top (i32.const 0x80000000))
      (local.set $mu (i32.const 0))
      (block $topDone
        (loop $topLoop
          (br_if $topDone (i32.ge_u (local.get $mu) (local.get $p)))
          (local.set $rr (i32.sub ${M_AT('(local.get $mu)')} (i32.mul ${ROW_AT('(local.get $mu)')} (local.get $si))))
          (local.set $top (select (local.get $rr) (local.get $top) (i32.gt_s (local.get $rr) (local.get $top))))
          (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
          (br $topLoop)))
      (local.set $f (f64.const 0))
      (local.set $mu (i32.const 0))
      (block $exactDone
        (loop $exact
          (br_if $exactDone (i32.ge_u (local.get $mu) (local.get $p)))
          (local.set $xv ${ROW_AT('(local.get $mu)')})
          (local.set $f (f64.add (local.get $f) (f64.mul (f64.convert_i32_s (local.get $xv))
            (f64.load (i32.add (local.get $table) (i32.shl (i32.sub (local.get $top) (i32.sub ${M_AT('(local.get $mu)')} (i32.mul (local.get $xv) (local.get $si)))) (i32.const 3)))))))
          (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
          (br $exact)))`

const DECIDE_F = '(select (i32.const 1) (select (i32.const -1) (local.get $si) (f64.lt (local.get $f) (f64.const 0))) (f64.gt (local.get $f) (f64.const 0)))'

/** Leaves the raw field of neuron $i (row $row, state $si) in $f: exact, from the vector C unless s_i = 0. */
const POLY_FIELD = `
      (if (local.get $si)
        (then
          ${maskedSum()}
          (local.set $f (f64.mul (f64.add (f64.mul (f64.convert_i32_s (local.get $si)) (local.get $k0)) (f64.sub (local.get $k1) (f64.add (local.get $neg) (local.get $neg)))) (f64.const 0.5))))
        (else ${EXACT_POLY}))`

/** Leaves the zero-temperature decision for neuron $i in $v: the sign of G where certain, else of the plain field. */
const EXP_DECIDE = `
      ${maskedSum()}
      (local.set $f (f64.sub (f64.sub (local.get $k0) (f64.add (local.get $neg) (local.get $neg)))
        (f64.mul (f64.mul (f64.convert_i32_s (local.get $si)) (local.get $k0)) (f64.const ${Math.tanh(1)}))))
      (if (f64.gt (local.get $f) (local.get $k1))
        (then (local.set $v (i32.const 1)))
        (else
          (if (f64.lt (local.get $f) (f64.neg (local.get $k1)))
            (then (local.set $v (i32.const -1)))
            (else
              ${EXACT_EXP}
              (local.set $v ${DECIDE_F})))))`

function memDecide (kind: MemoryKind): string {
  return kind === 'Poly' ? `${POLY_FIELD}\n      (local.set $v ${DECIDE_F})` : EXP_DECIDE
}

/** Makes the vector and its sums current for m, and loads the sums into $k0, $k1. */
function memRefresh (kind: MemoryKind): string {
  const args = kind === 'Poly' ? '(local.get $m) (local.get $vec) (local.get $table) (local.get $p) (local.get $off) (local.get $sums)' : '(local.get $m) (local.get $vec) (local.get $table) (local.get $p) (local.get $sums)'
  return `(call $memVector${kind} ${args})
      (local.set $k0 (f64.load (local.get $sums)))
      (local.set $k1 (f64.load offset=8 (local.get $sums)))`
}

/** s_i ← $v, m += (v − s_i)·ξ_i, vector rebuilt. */
function memChange (kind: MemoryKind): string {
  return `(i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
          (local.set $delta (i32.sub (local.get $v) (local.get $si)))
          ${flip(32)}
          ${memRefresh(kind)}`
}

function denseMemory (kind: MemoryKind): string {
  const vector = kind === 'Poly'
    ? `
  ;; C_μ = D(m_μ − 1) + D(m_μ + 1), and Σ(A − B), ΣC into sums (exact integers: see the eligibility).
  ${header('memVectorPoly', '$memVectorPoly')}
    (local $mu i32) (local $ix i32) (local $a f64) (local $b f64) (local $sab f64) (local $sc f64)
    (block $done
      (loop $each
        (br_if $done (i32.ge_u (local.get $mu) (local.get $p)))
        (local.set $ix (i32.add (local.get $table) (i32.shl (i32.add ${M_AT('(local.get $mu)')} (local.get $off)) (i32.const 3))))
        (local.set $a (f64.load (i32.sub (local.get $ix) (i32.const 8))))
        (local.set $b (f64.load offset=8 (local.get $ix)))
        (f64.store (i32.add (local.get $vec) (i32.shl (local.get $mu) (i32.const 3))) (f64.add (local.get $a) (local.get $b)))
        (local.set $sab (f64.add (local.get $sab) (f64.sub (local.get $a) (local.get $b))))
        (local.set $sc (f64.add (local.get $sc) (f64.add (local.get $a) (local.get $b))))
        (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
        (br $each)))
    (f64.store (local.get $sums) (local.get $sab))
    (f64.store offset=8 (local.get $sums) (local.get $sc)))`
    : `
  ;; E_μ = e^{−(M' − m_μ)}, M' = max m + 1, then S = ΣE and the certainty margin τ into sums.
  ${header('memVectorExp', '$memVectorExp')}
    (local $mu i32) (local $top i32) (local $mm i32) (local $ev f64) (local $sum f64)
    (local.set $top (i32.const 0x80000000))
    (block $done
      (loop $each
        (br_if $done (i32.ge_u (local.get $mu) (local.get $p)))
        (local.set $mm ${M_AT('(local.get $mu)')})
        (local.set $top (select (local.get $mm) (local.get $top) (i32.gt_s (local.get $mm) (local.get $top))))
        (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
        (br $each)))
    (local.set $top (i32.add (local.get $top) (i32.const 1)))
    (local.set $mu (i32.const 0))
    (block $done2
      (loop $each2
        (br_if $done2 (i32.ge_u (local.get $mu) (local.get $p)))
        (local.set $ev (f64.load (i32.add (local.get $table) (i32.shl (i32.sub (local.get $top) ${M_AT('(local.get $mu)')}) (i32.const 3)))))
        (f64.store (i32.add (local.get $vec) (i32.shl (local.get $mu) (i32.const 3))) (local.get $ev))
        (local.set $sum (f64.add (local.get $sum) (local.get $ev)))
        (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
        (br $each2)))
    (f64.store (local.get $sums) (local.get $sum))
    (f64.store offset=8 (local.get $sums) (f64.add
      (f64.mul (local.get $sum) (f64.mul (f64.convert_i32_u (i32.add (i32.shl (local.get $p) (i32.const 4)) (i32.const 64))) (f64.const 0x1p-53)))
      (f64.mul (f64.convert_i32_u (local.get $p)) (f64.const 0x1p-1060)))))`
  const glauber = kind === 'Exp'
    ? ''
    : `
  ;; Asynchronous Glauber sweep (polynomial): s_i ← +1 iff noise[k]·(1 + exp(factor·h_i)) < 1.
  ${header('memGlauberPoly')}
    ${MEM_LOCALS}
    ${memRefresh(kind)}
    (local.set $k (i32.const 0))
    (loop $visit
      (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${POLY_FIELD}
      (local.set $v (select (i32.const 1) (i32.const -1)
        (f64.lt (f64.mul (f64.load (i32.add (local.get $noise) (i32.shl (local.get $k) (i32.const 3))))
          (f64.add (f64.const 1) (call $exp (f64.mul (local.get $factor) (local.get $f))))) (f64.const 1))))
      (if (i32.ne (local.get $v) (local.get $si)) (then ${memChange(kind)}))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n)))))

  ;; Synchronous Glauber step (polynomial): next_i from the current state, then s, m ← next.
  ${header('memGlauberSyncPoly')}
    ${MEM_LOCALS}
    ${memRefresh(kind)}
    (local.set $i (i32.const 0))
    (loop $visit
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${POLY_FIELD}
      (i32.store8 (i32.add (local.get $next) (local.get $i)) (select (i32.const 1) (i32.const -1)
        (f64.lt (f64.mul (f64.load (i32.add (local.get $noise) (i32.shl (local.get $i) (i32.const 3))))
          (f64.add (f64.const 1) (call $exp (f64.mul (local.get $factor) (local.get $f))))) (f64.const 1))))
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    ${memApply()})`
  return `${vector}

  ;; Zero-temperature asynchronous sweep in the given order; returns 1 if any neuron changed.
  ${header(`memSweep${kind}`)}
    ${MEM_LOCALS} (local $changed i32)
    ${memRefresh(kind)}
    (local.set $k (i32.const 0))
    (loop $visit
      (local.set $i (i32.load (i32.add (local.get $order) (i32.shl (local.get $k) (i32.const 2)))))
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${memDecide(kind)}
      (if (i32.ne (local.get $v) (local.get $si))
        (then
          ${memChange(kind)}
          (local.set $changed (i32.const 1))))
      (br_if $visit (i32.lt_u (local.tee $k (i32.add (local.get $k) (i32.const 1))) (local.get $n))))
    (local.get $changed))

  ;; Zero-temperature synchronous step (the contract of sync16): 1 fixed point (nothing written),
  ;; 2 two-cycle (compared when $check), else 0; unless 1, prev ← s(t−1) and s, m ← s(t).
  ${header(`memSync${kind}`)}
    ${MEM_LOCALS} (local $same i32)
    ${memRefresh(kind)}
    (local.set $same (i32.const 1))
    (local.set $i (i32.const 0))
    (loop $visit
      (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      ${memDecide(kind)}
      (i32.store8 (i32.add (local.get $next) (local.get $i)) (local.get $v))
      (if (i32.ne (local.get $v) (local.get $si)) (then (local.set $same (i32.const 0))))
      (br_if $visit (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))
    (if (local.get $same) (then (return (i32.const 1))))
    ${TWO_CYCLE_CHECK}
    ${memApply(true)}
    (local.get $same))
${glauber}`
}

/** s, m ← next, m updated from the changed neurons only; with `keepPrevious`, prev ← s first. */
function memApply (keepPrevious = false): string {
  return `(local.set $i (i32.const 0))
    (loop $apply
      (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $i))))
      (local.set $v (i32.load8_s (i32.add (local.get $next) (local.get $i))))
      ${keepPrevious ? '(i32.store8 (i32.add (local.get $prev) (local.get $i)) (local.get $si))' : ''}
      (if (i32.ne (local.get $v) (local.get $si))
        (then
          (i32.store8 (i32.add (local.get $s) (local.get $i)) (local.get $v))
          (local.set $delta (i32.sub (local.get $v) (local.get $si)))
          (local.set $row (i32.add (local.get $xi) (i32.mul (local.get $i) (local.get $pp))))
          ${flip(32)}))
      (br_if $apply (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $n))))`
}

/**
 * The modern softmax network (models/softmax/memory.ts): ±1 patterns x^μ (int8, pattern-major,
 * rows of d entries, the JavaScript layout itself) against a float64 state.
 *
 * ## Why this shape
 * The plain overlap x^μ·ξ is a sequential sum over i, one dependent addition per entry. Here
 * eight patterns run side by side, two per f64x2 lane pair, so eight such sums advance at
 * once, each lane adding exactly the plain terms in the plain order: the product of a ±1 entry
 * and a double is that double with its sign flipped or not, an exact operation done here by
 * XOR with the entry's sign bit (moved into place by a shift and a mask). The accumulation
 * out = Σ_μ c_μ x^μ runs sixteen entries of out at a time, each adding c_μ·x_i^μ in μ order, as
 * the plain loop does. Patterns left over from the blocks of eight run one at a time.
 * Rows are read sixteen bytes at a time past their end (up to 15 bytes of the next row, or of
 * the slack after the last): in the overlap pass those bytes meet state entries padded with
 * +0, whose sign flip adds ±0 and changes no sum; in the accumulation they only touch padding
 * entries of out, which the caller never reads.
 */
function softmax (): string {
  // The sign bit of byte t of each 64-bit lane, alone at the top of the lane: shifting left by
  // 56 − 8t takes it to bit 63 and drops the bytes above it, the AND with $sign (bit 63 of each
  // lane) drops the bytes below. An AND issues on more of the vector ports than a shift: with
  // two shifts (right by 8t + 7, left by 63) the weighted sum took 185 µs a pass at d = 400,
  // P = 2000, with this 133 µs; the overlap pass, bound by something else, is unchanged.
  const signOf = (v: string, t: number): string => t === 7 ? `(v128.and ${v} (local.get $sign))` : `(v128.and (i64x2.shl ${v} (i32.const ${56 - 8 * t})) (local.get $sign))`
  const SIGN_LOCAL = '(local $sign v128)'
  const SIGN_INIT = '(local.set $sign (v128.const i64x2 0x8000000000000000 0x8000000000000000))'
  const overlapHalf = (half: number): string => {
    const lines: string[] = []
    // Lane 0: pattern 2q at entries i + 8·half …, lane 1: pattern 2q + 1 at the same entries.
    const halves = half === 0 ? '0 1 2 3 4 5 6 7 16 17 18 19 20 21 22 23' : '8 9 10 11 12 13 14 15 24 25 26 27 28 29 30 31'
    for (let q = 0; q < 4; q++) {
      lines.push(`(local.set $w${q} (i8x16.shuffle ${halves} (v128.load (i32.add (local.get $r${2 * q}) (local.get $i))) (v128.load (i32.add (local.get $r${2 * q + 1}) (local.get $i)))))`)
    }
    for (let t = 0; t < 8; t++) {
      lines.push(`(local.set $sv (v128.load64_splat offset=${8 * (8 * half + t)} (local.get $sp)))`)
      for (let q = 0; q < 4; q++) lines.push(`(local.set $a${q} (f64x2.add (local.get $a${q}) (v128.xor (local.get $sv) ${signOf(`(local.get $w${q})`, t)})))`)
    }
    return lines.join('\n          ')
  }
  const rows = [1, 2, 3, 4, 5, 6, 7].map((j) => `(local.set $r${j} (i32.add (local.get $r${j - 1}) (local.get $d)))`).join('\n        ')
  const stores: string[] = []
  for (let q = 0; q < 4; q++) {
    stores.push(`(f64.store offset=${16 * q} (local.get $op) (f64.mul (f64x2.extract_lane 0 (local.get $a${q})) (local.get $scale)))`)
    stores.push(`(f64.store offset=${16 * q + 8} (local.get $op) (f64.mul (f64x2.extract_lane 1 (local.get $a${q})) (local.get $scale)))`)
  }
  // Accumulator k holds entries i + k (lane 0) and i + 8 + k (lane 1), the lanes signOf(·, k) serves.
  const accumulate = [0, 1, 2, 3, 4, 5, 6, 7].map((k) => `(local.set $a${k} (f64x2.add (local.get $a${k}) (v128.xor (local.get $cv) ${signOf('(local.get $v0)', k)})))`)
  const loadSums = [0, 1, 2, 3, 4, 5, 6, 7].map((k) => `(local.set $a${k} (f64x2.replace_lane 1 (f64x2.splat (f64.load offset=${8 * k} (local.get $op))) (f64.load offset=${8 * (8 + k)} (local.get $op))))`)
  const storeSums = [0, 1, 2, 3, 4, 5, 6, 7].map((k) => `(f64.store offset=${8 * k} (local.get $op) (f64x2.extract_lane 0 (local.get $a${k}))) (f64.store offset=${8 * (8 + k)} (local.get $op) (f64x2.extract_lane 1 (local.get $a${k})))`)
  return `
  ;; out[μ] = (Σ_i x_i^μ·st[i]) · scale for μ < p, each sum in the plain order (st padded with +0 to a
  ;; multiple of 16). Eight patterns at a time, two per f64x2: the halves of two rows are paired
  ;; so that a shift and a mask put the sign of each one's entry i into its lane's sign bit.
  ${header('softmaxOverlaps')}
    (local $mu i32) (local $i i32) (local $sp i32) (local $op i32) (local $sv v128) (local $dot f64) (local $rr i32)
    (local $a0 v128) (local $a1 v128) (local $a2 v128) (local $a3 v128)
    (local $w0 v128) (local $w1 v128) (local $w2 v128) (local $w3 v128)
    (local $r0 i32) (local $r1 i32) (local $r2 i32) (local $r3 i32) (local $r4 i32) (local $r5 i32) (local $r6 i32) (local $r7 i32) ${SIGN_LOCAL}
    ${SIGN_INIT}
    (block $blocksDone
      (loop $block
        (br_if $blocksDone (i32.gt_u (i32.add (local.get $mu) (i32.const 8)) (local.get $p)))
        (local.set $r0 (i32.add (local.get $pat) (i32.mul (local.get $mu) (local.get $d))))
        ${rows}
        (local.set $a0 (v128.const i32x4 0 0 0 0))
        (local.set $a1 (v128.const i32x4 0 0 0 0))
        (local.set $a2 (v128.const i32x4 0 0 0 0))
        (local.set $a3 (v128.const i32x4 0 0 0 0))
        (local.set $i (i32.const 0))
        (local.set $sp (local.get $st))
        (loop $chunk
          ${overlapHalf(0)}
          ${overlapHalf(1)}
          (local.set $sp (i32.add (local.get $sp) (i32.const 128)))
          (br_if $chunk (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 16))) (local.get $d))))
        (local.set $op (i32.add (local.get $out) (i32.shl (local.get $mu) (i32.const 3))))
        ${stores.join('\n        ')}
        (local.set $mu (i32.add (local.get $mu) (i32.const 8)))
        (br $block)))
    (block $tailDone
      (loop $tail
        (br_if $tailDone (i32.ge_u (local.get $mu) (local.get $p)))
        (local.set $rr (i32.add (local.get $pat) (i32.mul (local.get $mu) (local.get $d))))
        (local.set $dot (f64.const 0))
        (local.set $i (i32.const 0))
        (loop $entry
          (local.set $dot (f64.add (local.get $dot) (f64.mul (f64.convert_i32_s (i32.load8_s (i32.add (local.get $rr) (local.get $i)))) (f64.load (i32.add (local.get $st) (i32.shl (local.get $i) (i32.const 3)))))))
          (br_if $entry (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 1))) (local.get $d))))
        (f64.store (i32.add (local.get $out) (i32.shl (local.get $mu) (i32.const 3))) (f64.mul (local.get $dot) (local.get $scale)))
        (local.set $mu (i32.add (local.get $mu) (i32.const 1)))
        (br $tail))))

  ;; out[i] = Σ_μ coef[μ]·x_i^μ for i < d (rounded up to 16), each starting from +0 and adding in μ
  ;; order. Blocks of 64 patterns (their rows stay in the first-level cache) run over all the
  ;; entries before the next block, the sums kept in out in between: each sum still adds in μ order.
  ${header('softmaxAccumulate')}
    (local $mu i32) (local $mb i32) (local $me i32) (local $i i32) (local $rp i32) (local $op i32) (local $cv v128)
    (local $a0 v128) (local $a1 v128) (local $a2 v128) (local $a3 v128) (local $a4 v128) (local $a5 v128) (local $a6 v128) (local $a7 v128) (local $v0 v128) ${SIGN_LOCAL}
    ${SIGN_INIT}
    (memory.fill (local.get $out) (i32.const 0) (i32.shl (i32.and (i32.add (local.get $d) (i32.const 15)) (i32.const -16)) (i32.const 3)))
    (block $blocksDone
      (loop $block
        (br_if $blocksDone (i32.ge_u (local.get $mb) (local.get $p)))
        (local.set $me (select (local.get $p) (i32.add (local.get $mb) (i32.const 64)) (i32.lt_u (i32.sub (local.get $p) (local.get $mb)) (i32.const 64))))
        (local.set $i (i32.const 0))
        (loop $chunk
          (local.set $op (i32.add (local.get $out) (i32.shl (local.get $i) (i32.const 3))))
          ${loadSums.join('\n          ')}
          (local.set $rp (i32.add (i32.add (local.get $pat) (i32.mul (local.get $mb) (local.get $d))) (local.get $i)))
          (local.set $mu (local.get $mb))
          (loop $pattern
            (local.set $cv (v128.load64_splat (i32.add (local.get $coef) (i32.shl (local.get $mu) (i32.const 3)))))
            (local.set $v0 (v128.load (local.get $rp)))
            ${accumulate.join('\n            ')}
            (local.set $rp (i32.add (local.get $rp) (local.get $d)))
            (br_if $pattern (i32.lt_u (local.tee $mu (i32.add (local.get $mu) (i32.const 1))) (local.get $me))))
          ${storeSums.join('\n          ')}
          (br_if $chunk (i32.lt_u (local.tee $i (i32.add (local.get $i) (i32.const 16))) (local.get $d))))
        (local.set $mb (local.get $me))
        (br $block))))`
}

/**
 * The fixed in-degree network (network/sparse-in-degree.ts): integer couplings in adjacency
 * lists, exact int32 fields h (the network checks K·max|T| < 2³¹). Rows (inputs, weights) and
 * out-lists (targets, tw; offsets outStart, int32) hold neurons as uint16 and couplings as
 * int16 (the network runs the kernel only for N ≤ 65536 and |T| ≤ 32767): 8 bytes an edge in
 * all, half the plain path's, and half the memory traffic of a field build. A change of s_j by
 * Δ adds Δ·T_ij to the fields of the neurons j projects to.
 *
 * ## Why this shape
 * The plain path pays a JavaScript call and bounds checks per visit and per edge; here a
 * whole sweep (or a whole zero-temperature trial, shuffles included) is one call, and the
 * field build h = T s is a tight gather over the rows. Integer sums are exact in any order, so
 * every field, and every decision (ties keep s_i), is the plain one.
 */
const SPARSE_DECIDE = '(select (i32.const 1) (select (i32.const -1) (local.get $si) (i32.lt_s (local.get $hi) (i32.const 0))) (i32.gt_s (local.get $hi) (i32.const 0)))'

/** s_j changed by $delta: the fields of j's targets follow. Uses $j $e $ee. */
const SPARSE_SCATTER = `
          (local.set $e (i32.load (i32.add (local.get $outStart) (i32.shl (local.get $j) (i32.const 2)))))
          (local.set $ee (i32.load offset=4 (i32.add (local.get $outStart) (i32.shl (local.get $j) (i32.const 2)))))
          (block $scattered
            (loop $scatter
              (br_if $scattered (i32.ge_u (local.get $e) (local.get $ee)))
              (local.set $ta (i32.add (local.get $h) (i32.shl (i32.load16_u (i32.add (local.get $targets) (i32.shl (local.get $e) (i32.const 1)))) (i32.const 2))))
              (i32.store (local.get $ta) (i32.add (i32.load (local.get $ta)) (i32.mul (local.get $delta) (i32.load16_s (i32.add (local.get $tw) (i32.shl (local.get $e) (i32.const 1)))))))
              (local.set $e (i32.add (local.get $e) (i32.const 1)))
              (br $scatter)))`

const SPARSE_LOCALS = '(local $kk i32) (local $j i32) (local $si i32) (local $v i32) (local $hi i32) (local $delta i32) (local $e i32) (local $ee i32) (local $ta i32)'

/** One zero-temperature asynchronous sweep over $order; sets $changed. */
const SPARSE_SWEEP = `
    (local.set $kk (i32.const 0))
    (block $swept
      (loop $visit
        (br_if $swept (i32.ge_u (local.get $kk) (local.get $n)))
        (local.set $j (i32.load (i32.add (local.get $order) (i32.shl (local.get $kk) (i32.const 2)))))
        (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $j))))
        (local.set $hi (i32.load (i32.add (local.get $h) (i32.shl (local.get $j) (i32.const 2)))))
        (local.set $v ${SPARSE_DECIDE})
        (if (i32.ne (local.get $v) (local.get $si))
          (then
            (i32.store8 (i32.add (local.get $s) (local.get $j)) (local.get $v))
            (local.set $delta (i32.sub (local.get $v) (local.get $si)))
            ${SPARSE_SCATTER}
            (local.set $changed (i32.const 1))))
        (local.set $kk (i32.add (local.get $kk) (i32.const 1)))
        (br $visit)))`

/** s ← next with the fields following every change; with `keepPrevious`, prev ← s first. */
function sparseApply (keepPrevious: boolean): string {
  return `(local.set $j (i32.const 0))
    (block $applied
      (loop $apply
        (br_if $applied (i32.ge_u (local.get $j) (local.get $n)))
        (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $j))))
        (local.set $v (i32.load8_s (i32.add (local.get $next) (local.get $j))))
        ${keepPrevious ? '(i32.store8 (i32.add (local.get $prev) (local.get $j)) (local.get $si))' : ''}
        (if (i32.ne (local.get $v) (local.get $si))
          (then
            (i32.store8 (i32.add (local.get $s) (local.get $j)) (local.get $v))
            (local.set $delta (i32.sub (local.get $v) (local.get $si)))
            ${SPARSE_SCATTER}))
        (local.set $j (i32.add (local.get $j) (i32.const 1)))
        (br $apply)))`
}

function sparse (): string {
  const glauberUp = (noiseIndex: string): string => `
        ${onePlusExp('(local.get $hi)')}
        (local.set $v (select (i32.const 1) (i32.const -1)
          (f64.lt (f64.mul (f64.load (i32.add (local.get $noise) (i32.shl ${noiseIndex} (i32.const 3)))) (local.get $g)) (f64.const 1))))`
  return `
  ;; h_i = Σ_{e in row i} w_e·s[in_e], rows of k edges: gathers from the state (N bytes, in the
  ;; first-level cache), four edges per step into two sums.
  ${header('sparseLoad')}
    (local $i i32) (local $e i32) (local $ee i32) (local $e4 i32) (local $acc i32) (local $acc2 i32) (local $ip i32) (local $wp i32)
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $i) (local.get $n)))
        (local.set $acc (i32.const 0))
        (local.set $acc2 (i32.const 0))
        (local.set $ee (i32.add (local.get $e) (local.get $k)))
        (local.set $e4 (i32.sub (local.get $ee) (i32.const 3)))
        (block $quadsDone
          (loop $quad
            (br_if $quadsDone (i32.ge_s (local.get $e) (local.get $e4)))
            (local.set $ip (i32.add (local.get $inputs) (i32.shl (local.get $e) (i32.const 1))))
            (local.set $wp (i32.add (local.get $weights) (i32.shl (local.get $e) (i32.const 1))))
            (local.set $acc (i32.add (local.get $acc) (i32.add
              (i32.mul (i32.load16_s (local.get $wp)) (i32.load8_s (i32.add (local.get $s) (i32.load16_u (local.get $ip)))))
              (i32.mul (i32.load16_s offset=2 (local.get $wp)) (i32.load8_s (i32.add (local.get $s) (i32.load16_u offset=2 (local.get $ip))))))))
            (local.set $acc2 (i32.add (local.get $acc2) (i32.add
              (i32.mul (i32.load16_s offset=4 (local.get $wp)) (i32.load8_s (i32.add (local.get $s) (i32.load16_u offset=4 (local.get $ip)))))
              (i32.mul (i32.load16_s offset=6 (local.get $wp)) (i32.load8_s (i32.add (local.get $s) (i32.load16_u offset=6 (local.get $ip))))))))
            (local.set $e (i32.add (local.get $e) (i32.const 4)))
            (br $quad)))
        (block $rowDone
          (loop $edge
            (br_if $rowDone (i32.ge_u (local.get $e) (local.get $ee)))
            (local.set $acc (i32.add (local.get $acc) (i32.mul
              (i32.load16_s (i32.add (local.get $weights) (i32.shl (local.get $e) (i32.const 1))))
              (i32.load8_s (i32.add (local.get $s) (i32.load16_u (i32.add (local.get $inputs) (i32.shl (local.get $e) (i32.const 1)))))))))
            (local.set $e (i32.add (local.get $e) (i32.const 1)))
            (br $edge)))
        (i32.store (i32.add (local.get $h) (i32.shl (local.get $i) (i32.const 2))) (i32.add (local.get $acc) (local.get $acc2)))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row))))

  ;; One zero-temperature asynchronous sweep in the given order; returns 1 if any neuron changed.
  ${header('sparseSweep')}
    ${SPARSE_LOCALS} (local $changed i32)
    ${SPARSE_SWEEP}
    (local.get $changed))

  ;; A whole zero-temperature asynchronous trial (the contract of runAsync16): returns 2·sweeps + (1 if the last sweep changed a neuron).
  ${header('sparseRunAsync')}
    ${SPARSE_LOCALS} (local $changed i32) (local $sweeps i32) (local $drew i32)
    (local $s0 i64) (local $s1 i64) (local $s2 i64) (local $s3 i64) (local $t i64) (local $x i64)
    (local $fi i32) (local $fj i32) (local $fpi i32) (local $fpj i32) (local $ftmp i32)
    ${XOSHIRO_LOAD}
    (loop $trial
      (local.set $sweeps (i32.add (local.get $sweeps) (i32.const 1)))
      (if (i32.and (local.get $shuffle) (i32.ge_u (local.get $n) (i32.const 2)))
        (then
          (local.set $drew (i32.const 1))
          (local.set $fi (i32.sub (local.get $n) (i32.const 1)))
          (loop $draw
            ${XOSHIRO_NEXT}
            (local.set $t (i64.extend_i32_u (i32.add (local.get $fi) (i32.const 1))))
            (local.set $fj ${BELOW_T})
            (local.set $fpi (i32.add (local.get $order) (i32.shl (local.get $fi) (i32.const 2))))
            (local.set $fpj (i32.add (local.get $order) (i32.shl (local.get $fj) (i32.const 2))))
            (local.set $ftmp (i32.load (local.get $fpi)))
            (i32.store (local.get $fpi) (i32.load (local.get $fpj)))
            (i32.store (local.get $fpj) (local.get $ftmp))
            (br_if $draw (local.tee $fi (i32.sub (local.get $fi) (i32.const 1)))))))
      (local.set $changed (i32.const 0))
      ${SPARSE_SWEEP}
      (br_if $trial (i32.and (local.get $changed) (i32.lt_u (local.get $sweeps) (local.get $max)))))
    (i64.store (local.get $state) (local.get $s0))
    (i64.store offset=8 (local.get $state) (local.get $s1))
    (i64.store offset=16 (local.get $state) (local.get $s2))
    (i64.store offset=24 (local.get $state) (local.get $s3))
    (if (local.get $drew) (then (i64.store offset=32 (local.get $state) (local.get $x))))
    (i32.add (i32.shl (local.get $sweeps) (i32.const 1)) (local.get $changed)))

  ;; Zero-temperature synchronous step (the contract of sync16); the fields follow the changes.
  ${header('sparseSync')}
    ${SPARSE_LOCALS} (local $same i32) (local $i i32)
    (local.set $same (i32.const 1))
    (local.set $j (i32.const 0))
    (block $decided
      (loop $decide
        (br_if $decided (i32.ge_u (local.get $j) (local.get $n)))
        (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $j))))
        (local.set $hi (i32.load (i32.add (local.get $h) (i32.shl (local.get $j) (i32.const 2)))))
        (local.set $v ${SPARSE_DECIDE})
        (i32.store8 (i32.add (local.get $next) (local.get $j)) (local.get $v))
        (if (i32.ne (local.get $v) (local.get $si)) (then (local.set $same (i32.const 0))))
        (local.set $j (i32.add (local.get $j) (i32.const 1)))
        (br $decide)))
    (if (local.get $same) (then (return (i32.const 1))))
    ${TWO_CYCLE_CHECK}
    ${sparseApply(true)}
    (local.get $same))

  ;; Asynchronous Glauber sweep, noise[k] the uniform of the k-th visit (1 + exp(factor·h) tabulated).
  ${header('sparseGlauber')}
    ${SPARSE_LOCALS} ${TABLE_LOCALS}
    (local.set $kk (i32.const 0))
    (block $swept
      (loop $visit
        (br_if $swept (i32.ge_u (local.get $kk) (local.get $n)))
        (local.set $j (i32.load (i32.add (local.get $order) (i32.shl (local.get $kk) (i32.const 2)))))
        (local.set $si (i32.load8_s (i32.add (local.get $s) (local.get $j))))
        (local.set $hi (i32.load (i32.add (local.get $h) (i32.shl (local.get $j) (i32.const 2)))))
        ${glauberUp('(local.get $kk)')}
        (if (i32.ne (local.get $v) (local.get $si))
          (then
            (i32.store8 (i32.add (local.get $s) (local.get $j)) (local.get $v))
            (local.set $delta (i32.sub (local.get $v) (local.get $si)))
            ${SPARSE_SCATTER}))
        (local.set $kk (i32.add (local.get $kk) (i32.const 1)))
        (br $visit))))

  ;; Synchronous Glauber step: next_j from h_j and noise[j], then s ← next with the fields following.
  ${header('sparseGlauberSync')}
    ${SPARSE_LOCALS} ${TABLE_LOCALS}
    (local.set $j (i32.const 0))
    (block $decided
      (loop $decide
        (br_if $decided (i32.ge_u (local.get $j) (local.get $n)))
        (local.set $hi (i32.load (i32.add (local.get $h) (i32.shl (local.get $j) (i32.const 2)))))
        ${glauberUp('(local.get $j)')}
        (i32.store8 (i32.add (local.get $next) (local.get $j)) (local.get $v))
        (local.set $j (i32.add (local.get $j) (i32.const 1)))
        (br $decide)))
    ${sparseApply(false)})`
}

/** What each module holds, in the order its binary lists the functions. */
const MODULE_PARTS: Record<KernelModule, () => string[]> = {
  random: () => [shuffle(), partialShuffle(), unbiasedRows(), uniforms()],
  overlap: () => [overlapsFunction(16), overlapsFunction(32), transpose(), signBits(), runAsync16(), sumSquares16()],
  overlapMore: () => [variant(16), variant(32), runGlauber16(), runSync16Bounded(), runSync(32)],
  dense: () => [dense(), dense16()],
  memory: () => [overlapsFunction(32), transpose(), denseMemory('Poly'), denseMemory('Exp')],
  softmax: () => [softmax()],
  sparse: () => [signBits(), sparse()]
}

/** Modules that run on the memory of another module's instance (imported as env.memory). */
const SHARES_MEMORY = new Set<KernelModule>(['overlapMore'])

/** One module's WebAssembly text. */
export function kernelsWat (module: KernelModule): string {
  writing = module
  emitted.clear()
  const text = `(module
  (import "host" "exp" (func $exp (param f64) (result f64)))
  (import "host" "sweepDone" (func $sweepDone (param i32)))
  ${module === 'overlapMore' ? '(import "host" "classifySample" (func $classifySample (result i32)))' : ''}
  ${SHARES_MEMORY.has(module) ? '(import "env" "memory" (memory 1))' : '(memory (export "memory") 1)'}
${MODULE_PARTS[module]().join('\n')}
)
`
  const missing = Object.entries(KERNEL_SIGNATURES).filter(([name, sig]) => (sig.modules as readonly string[]).includes(module) && !emitted.has(name)).map(([name]) => name)
  if (missing.length > 0) throw new Error(`KERNEL_SIGNATURES lists kernels of module ${module} with no body: ${missing.join(', ')}`)
  return text
}

/** Assembles every module with wabt: their bytes and the text of kernels.generated.ts that embeds them. */
export async function assembleKernels (): Promise<{ wasm: Record<KernelModule, Uint8Array>, generated: string }> {
  const wabt = await wabtFactory()
  const wasm = {} as Record<KernelModule, Uint8Array>
  const entries: string[] = []
  for (const module of KERNEL_MODULES) {
    const mod = wabt.parseWat(`${module}.wat`, kernelsWat(module), { simd: true, bulk_memory: true })
    try {
      mod.validate()
      wasm[module] = Uint8Array.from(mod.toBinary({}).buffer)
    } finally {
      mod.destroy()
    }
    const bytes = Array.from(wasm[module])
    const lines: string[] = []
    for (let k = 0; k < bytes.length; k += 32) lines.push(`    ${bytes.slice(k, k + 32).join(', ')}`)
    entries.push(`  ${module}: [\n${lines.join(',\n')}\n  ]`)
  }
  const generated = `// Generated by scripts/gen-kernels.ts (npm run kernels:generate). Do not edit by hand.
// The WebAssembly SIMD128 modules of the engine's fast paths; their text source, layout notes
// and the reasons for each kernel's shape live in the generator.

/**
 * Each module's bytes. Plain number literals, not base64: the parser builds these arrays when
 * the engine is loaded, where decoding base64 would cost a few milliseconds of JavaScript in
 * the first run that compiles the module.
 */
export const KERNEL_MODULE_BYTES: Readonly<Record<string, readonly number[]>> = {
${entries.join(',\n')}
}
`
  return { wasm, generated }
}

/** Where the generated module lives in the repository. */
export const GENERATED_PATH = fileURLToPath(new URL('../src/engine/kernels/kernels.generated.ts', import.meta.url))

async function main (): Promise<void> {
  const { wasm, generated } = await assembleKernels()
  const target = process.env.KERNEL_OUT ?? GENERATED_PATH
  writeFileSync(target, generated)
  console.log(`wrote ${target} (${Object.entries(wasm).map(([module, bytes]) => `${module} ${bytes.length}`).join(', ')} bytes of wasm)`)
}

if (process.argv[1] === fileURLToPath(import.meta.url)) await main()
