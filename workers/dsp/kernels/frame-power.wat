;; The per-frame power readout of a map, in WebAssembly SIMD (128-bit), for workers/dsp/fft.ts.
;;
;; Why a kernel of our own: PFFFT (@echogarden/pffft-wasm) does the transform, but no package reads a
;; window's spectral taps and the powers out of its output; done in JavaScript that pass cost more than
;; the transform itself. This module imports PFFFT's WebAssembly.Memory and works on its buffers in
;; place, four bins per step.
;;
;; Source of workers/dsp/kernels/frame-power.wasm.ts, made by workers/dsp/kernels/build.ts
;; (`npm run build:kernels`, with the wabt package).
;;
;; Layout read (pffft.h, pffft_transform_ordered, real transform of N points, H = N/2):
;;   y[0] = X[0], y[1] = X[H] (both real), y[2k] = Re X[k], y[2k+1] = Im X[k] for k = 1…H−1.
(module
  (import "env" "memory" (memory 1))
  ;; pffft_transform_ordered(setup, input, output, work, direction) of the same PFFFT instance
  (import "pffft" "transform_ordered" (func $transform (param i32 i32 i32 i32 i32)))

  ;; frames(setup, src, hop, count, y, work, w, tmp, out, h, c1, c0, scale, edge): `count` frames of
  ;; N = 2h samples at src, src + hop, … (bytes; each 16-byte aligned): transformed by PFFFT into y (work
  ;; its scratch), read out by narrowPower into rows of h + 1 floats from out. With w ≠ 0 each frame is
  ;; first multiplied by the window at w into tmp (then c1 = 1, c0 = 0). One call per batch instead of
  ;; three JavaScript-to-WASM calls per frame.
  (func (export "frames")
    (param $setup i32) (param $src i32) (param $hop i32) (param $count i32) (param $y i32) (param $work i32)
    (param $w i32) (param $tmp i32) (param $out i32) (param $h i32)
    (param $c1 f32) (param $c0 f32) (param $scale f32) (param $edge f32)
    (local $row i32)
    (local.set $row (i32.shl (i32.add (local.get $h) (i32.const 1)) (i32.const 2)))
    (block $done
      (loop $frame
        (br_if $done (i32.eqz (local.get $count)))
        (if (local.get $w)
          (then
            (call $multiply (local.get $src) (local.get $w) (local.get $tmp) (i32.shl (local.get $h) (i32.const 1)))
            (call $transform (local.get $setup) (local.get $tmp) (local.get $y) (local.get $work) (i32.const 0)))
          (else
            (call $transform (local.get $setup) (local.get $src) (local.get $y) (local.get $work) (i32.const 0))))
        (call $narrowPower (local.get $y) (local.get $out) (local.get $h)
          (local.get $c1) (local.get $c0) (local.get $scale) (local.get $edge))
        (local.set $src (i32.add (local.get $src) (local.get $hop)))
        (local.set $out (i32.add (local.get $out) (local.get $row)))
        (local.set $count (i32.sub (local.get $count) (i32.const 1)))
        (br $frame)))
  )

  ;; narrowPower(y, out, h, c1, c0, scale, edge): out[k] = |c1·X[k] + c0·(X[k−1] + X[k+1])|²·s for
  ;; k = 0…h, s = edge at k = 0 and k = h, scale elsewhere — a periodic window of at most two cosine terms
  ;; (rect c0 = 0; Hann, Hamming) applied by convolution in the frequency domain (Harris 1978, §V),
  ;; with X[−1] = conj X[1] and X[h+1] = conj X[h−1]. y and out are byte addresses; h ≥ 8 and h mod 4 = 0.
  (func $narrowPower (export "narrowPower")
    (param $y i32) (param $out i32) (param $h i32)
    (param $c1 f32) (param $c0 f32) (param $scale f32) (param $edge f32)
    (local $x0 f32) (local $xh f32) (local $r1 f32) (local $i1 f32)
    (local $rl f32) (local $il f32) (local $a f32) (local $b f32)
    (local $p i32) (local $q i32) (local $end i32) (local $top i32)
    (local $vc1 v128) (local $vc0 v128) (local $vs v128)
    (local $vm v128) (local $vn v128) (local $a0 v128) (local $a1 v128)

    (local.set $x0 (f32.load (local.get $y)))
    (local.set $xh (f32.load offset=4 (local.get $y)))
    (local.set $r1 (f32.load offset=8 (local.get $y)))
    (local.set $i1 (f32.load offset=12 (local.get $y)))
    ;; $top = address of X[h−1]
    (local.set $top (i32.add (local.get $y) (i32.shl (i32.sub (local.get $h) (i32.const 1)) (i32.const 3))))
    (local.set $rl (f32.load (local.get $top)))
    (local.set $il (f32.load offset=4 (local.get $top)))

    ;; k = 0: a = c1·X[0] + 2·c0·Re X[1]; the imaginary parts cancel
    (local.set $a (f32.add (f32.mul (local.get $c1) (local.get $x0))
                           (f32.mul (f32.add (local.get $c0) (local.get $c0)) (local.get $r1))))
    (f32.store (local.get $out) (f32.mul (f32.mul (local.get $a) (local.get $a)) (local.get $edge)))

    ;; k = 1: neighbours X[0] (real) and X[2]
    (local.set $a (f32.add (f32.mul (local.get $c1) (local.get $r1))
                           (f32.mul (local.get $c0) (f32.add (local.get $x0) (f32.load offset=16 (local.get $y))))))
    (local.set $b (f32.add (f32.mul (local.get $c1) (local.get $i1))
                           (f32.mul (local.get $c0) (f32.load offset=20 (local.get $y)))))
    (f32.store offset=4 (local.get $out)
      (f32.mul (f32.add (f32.mul (local.get $a) (local.get $a)) (f32.mul (local.get $b) (local.get $b))) (local.get $scale)))

    ;; k = h − 1: neighbours X[h−2] and X[h] (real)
    (local.set $a (f32.add (f32.mul (local.get $c1) (local.get $rl))
                           (f32.mul (local.get $c0) (f32.add (f32.load (i32.sub (local.get $top) (i32.const 8))) (local.get $xh)))))
    (local.set $b (f32.add (f32.mul (local.get $c1) (local.get $il))
                           (f32.mul (local.get $c0) (f32.load (i32.sub (local.get $top) (i32.const 4))))))
    (local.set $q (i32.add (local.get $out) (i32.shl (local.get $h) (i32.const 2))))
    (f32.store (i32.sub (local.get $q) (i32.const 4))
      (f32.mul (f32.add (f32.mul (local.get $a) (local.get $a)) (f32.mul (local.get $b) (local.get $b))) (local.get $scale)))

    ;; k = h − 2: neighbours X[h−3] and X[h−1]
    (local.set $a (f32.add (f32.mul (local.get $c1) (f32.load (i32.sub (local.get $top) (i32.const 8))))
                           (f32.mul (local.get $c0) (f32.add (f32.load (i32.sub (local.get $top) (i32.const 16))) (local.get $rl)))))
    (local.set $b (f32.add (f32.mul (local.get $c1) (f32.load (i32.sub (local.get $top) (i32.const 4))))
                           (f32.mul (local.get $c0) (f32.add (f32.load (i32.sub (local.get $top) (i32.const 12))) (local.get $il)))))
    (f32.store (i32.sub (local.get $q) (i32.const 8))
      (f32.mul (f32.add (f32.mul (local.get $a) (local.get $a)) (f32.mul (local.get $b) (local.get $b))) (local.get $scale)))

    ;; k = h: a = c1·X[h] + 2·c0·Re X[h−1]
    (local.set $a (f32.add (f32.mul (local.get $c1) (local.get $xh))
                           (f32.mul (f32.add (local.get $c0) (local.get $c0)) (local.get $rl))))
    (f32.store (local.get $q) (f32.mul (f32.mul (local.get $a) (local.get $a)) (local.get $edge)))

    ;; k = 2 … h−3, four bins a step. $p points at X[k−1]; a v128 at X[j] holds Re, Im of X[j] and X[j+1].
    (local.set $vc1 (f32x4.splat (local.get $c1)))
    (local.set $vc0 (f32x4.splat (local.get $c0)))
    (local.set $vs (f32x4.splat (local.get $scale)))
    (local.set $p (i32.add (local.get $y) (i32.const 8)))
    (local.set $q (i32.add (local.get $out) (i32.const 8)))
    (local.set $end (i32.sub (local.get $top) (i32.const 16))) ;; X[h−3]: $p reaches it after the step for k = h−6
    (block $done
      (loop $bins
        (br_if $done (i32.ge_u (local.get $p) (local.get $end)))
        ;; X[k+1] is the right neighbour of the first pair and the left one of the second
        (local.set $vm (v128.load offset=16 align=4 (local.get $p)))
        ;; bins k, k+1
        (local.set $a0
          (f32x4.add
            (f32x4.mul (local.get $vc1) (v128.load offset=8 align=4 (local.get $p)))
            (f32x4.mul (local.get $vc0) (f32x4.add (v128.load align=4 (local.get $p)) (local.get $vm)))))
        ;; bins k+2, k+3
        (local.set $vn (v128.load offset=32 align=4 (local.get $p)))
        (local.set $a1
          (f32x4.add
            (f32x4.mul (local.get $vc1) (v128.load offset=24 align=4 (local.get $p)))
            (f32x4.mul (local.get $vc0) (f32x4.add (local.get $vm) (local.get $vn)))))
        (local.set $a0 (f32x4.mul (local.get $a0) (local.get $a0)))
        (local.set $a1 (f32x4.mul (local.get $a1) (local.get $a1)))
        ;; re² + im² of the four bins: even lanes plus odd lanes of (a0, a1)
        (v128.store align=4 (local.get $q)
          (f32x4.mul (local.get $vs)
            (f32x4.add
              (i8x16.shuffle 0 1 2 3 8 9 10 11 16 17 18 19 24 25 26 27 (local.get $a0) (local.get $a1))
              (i8x16.shuffle 4 5 6 7 12 13 14 15 20 21 22 23 28 29 30 31 (local.get $a0) (local.get $a1)))))
        (local.set $p (i32.add (local.get $p) (i32.const 32)))
        (local.set $q (i32.add (local.get $q) (i32.const 16)))
        (br $bins)))
  )

  ;; multiply(src, w, dst, n): dst[i] = src[i]·w[i], i = 0…n−1 (n mod 4 = 0): a window applied in time,
  ;; for the windows of more than two cosine terms. Byte addresses; src need not be aligned.
  (func $multiply (export "multiply") (param $src i32) (param $w i32) (param $dst i32) (param $n i32)
    (local $end i32)
    (local.set $end (i32.add (local.get $dst) (i32.shl (local.get $n) (i32.const 2))))
    (block $done
      (loop $step
        (br_if $done (i32.ge_u (local.get $dst) (local.get $end)))
        (v128.store (local.get $dst)
          (f32x4.mul (v128.load align=4 (local.get $src)) (v128.load (local.get $w))))
        (local.set $src (i32.add (local.get $src) (i32.const 16)))
        (local.set $w (i32.add (local.get $w) (i32.const 16)))
        (local.set $dst (i32.add (local.get $dst) (i32.const 16)))
        (br $step)))
  )

  ;; decibels(p, n): x ← 10·lg(max(x, 1e−30)) in place for the n floats at byte address p (n mod 4 = 0,
  ;; p 4-byte aligned): a map's mean-square powers as levels in dB, four at a step. x = m·2^e with m taken
  ;; into [√½, √2) from the IEEE 754 exponent and mantissa bits; ln m by the series
  ;; ln m = 2(t + t³/3 + t⁵/5 + t⁷/7 + …), t = (m − 1)/(m + 1) (Abramowitz & Stegun 4.1.27): |t| ≤ 0.172,
  ;; so the first omitted term 2t⁹/9 is below 3·10⁻⁸ (float32 rounding is about 6·10⁻⁸).
  ;; 10·lg x = (10/ln 10)·(ln m + e·ln 2).
  (func $decibels (export "decibels") (param $p i32) (param $n i32)
    (local $end i32) (local $x v128) (local $e v128) (local $m v128) (local $big v128) (local $t v128) (local $t2 v128)
    (local.set $end (i32.add (local.get $p) (i32.shl (local.get $n) (i32.const 2))))
    (block $done
      (loop $step
        (br_if $done (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $x (f32x4.max (v128.load align=4 (local.get $p)) (v128.const f32x4 1e-30 1e-30 1e-30 1e-30)))
        ;; e = biased exponent − 127; m = mantissa with exponent 0, in [1, 2)
        (local.set $e (i32x4.sub (i32x4.shr_u (local.get $x) (i32.const 23)) (v128.const i32x4 127 127 127 127)))
        (local.set $m (v128.or (v128.and (local.get $x) (v128.const i32x4 0x007fffff 0x007fffff 0x007fffff 0x007fffff))
                               (v128.const i32x4 0x3f800000 0x3f800000 0x3f800000 0x3f800000)))
        ;; m > √2: m ← m/2, e ← e + 1 (the lane mask is −1)
        (local.set $big (f32x4.gt (local.get $m) (v128.const f32x4 1.41421356 1.41421356 1.41421356 1.41421356)))
        (local.set $m (v128.bitselect (f32x4.mul (local.get $m) (v128.const f32x4 0.5 0.5 0.5 0.5)) (local.get $m) (local.get $big)))
        (local.set $e (i32x4.sub (local.get $e) (local.get $big)))
        (local.set $t (f32x4.div (f32x4.sub (local.get $m) (v128.const f32x4 1 1 1 1)) (f32x4.add (local.get $m) (v128.const f32x4 1 1 1 1))))
        (local.set $t2 (f32x4.mul (local.get $t) (local.get $t)))
        ;; 2t(1 + t²(1/3 + t²(1/5 + t²/7))) = ln m
        (local.set $t
          (f32x4.mul (f32x4.add (local.get $t) (local.get $t))
            (f32x4.add (v128.const f32x4 1 1 1 1)
              (f32x4.mul (local.get $t2)
                (f32x4.add (v128.const f32x4 0.333333333 0.333333333 0.333333333 0.333333333)
                  (f32x4.mul (local.get $t2)
                    (f32x4.add (v128.const f32x4 0.2 0.2 0.2 0.2)
                      (f32x4.mul (local.get $t2) (v128.const f32x4 0.142857143 0.142857143 0.142857143 0.142857143)))))))))
        ;; (10/ln 10)·(ln m + e·ln 2)
        (v128.store align=4 (local.get $p)
          (f32x4.mul (v128.const f32x4 4.34294482 4.34294482 4.34294482 4.34294482)
            (f32x4.add (local.get $t)
              (f32x4.mul (f32x4.convert_i32x4_s (local.get $e)) (v128.const f32x4 0.693147181 0.693147181 0.693147181 0.693147181)))))
        (local.set $p (i32.add (local.get $p) (i32.const 16)))
        (br $step)))
  )
)
