;; The square counting kernel in WebAssembly with 128-bit SIMD: the fast pass of square-counter.ts, two points per
;; step, over points that live in a shared WebAssembly memory (wasm-square-counter.ts). Same contract, same float64
;; operations in the same order as the JavaScript fast pass, so the same points reach the same cells:
;;   x = (dx * cos/s + dy * sin/s) - (u + i0),  y = (dy * cos/s - dx * sin/s) - (v + j0),  dx = px - Ox, dy = py - Oy
;; a point with -near < x < nx + near and -near < y < ny + near is in the grid's band; if both fractional parts lie
;; farther than `near` from 0 and 1 it is counted in cell trunc(y) * nx + trunc(x); otherwise its index goes to the
;; deferred list for the exact pass, which applies the contract's formula with division and floor:
;;   i = floor((dx cos t + dy sin t) / s - u) - i0,  j = floor((-dx sin t + dy cos t) / s - v) - j0.
;; WebAssembly has no implicit fused multiply-add, so every product and sum rounds as in JavaScript.
;; Assembled into count-kernel-wasm.ts by tools/assemble-wasm.mjs (npm run assemble:wasm); a test checks the two agree.
(module
  (memory (import "env" "memory") 1 65536 shared)

  ;; Fast pass over the pairs of points at byte address $pts (2 * $pairs points, x y float64 each), counting into the
  ;; int32 cells at $out and writing the indices (0-based from $pts) of deferred points to the int32 list at $def.
  ;; Returns how many points were deferred.
  (func (export "fastPass") (param $pts i32) (param $pairs i32) (param $out i32) (param $def i32)
        (param $ox f64) (param $oy f64) (param $cs f64) (param $sn f64) (param $shx f64) (param $shy f64)
        (param $nx i32) (param $ny i32) (param $near f64) (result i32)
    (local $p i32) (local $end i32) (local $k i32) (local $nd i32) (local $mask i32) (local $addr i32)
    (local $vox v128) (local $voy v128) (local $vcs v128) (local $vsn v128) (local $vshx v128) (local $vshy v128)
    (local $vlow v128) (local $vhighx v128) (local $vhighy v128) (local $vhalf v128) (local $vband v128) (local $vnx v128)
    (local $a v128) (local $b v128) (local $dx v128) (local $dy v128) (local $x v128) (local $y v128)
    (local $xi v128) (local $yi v128) (local $in v128) (local $near-line v128) (local $index v128)
    (local.set $vox (f64x2.splat (local.get $ox)))
    (local.set $voy (f64x2.splat (local.get $oy)))
    (local.set $vcs (f64x2.splat (local.get $cs)))
    (local.set $vsn (f64x2.splat (local.get $sn)))
    (local.set $vshx (f64x2.splat (local.get $shx)))
    (local.set $vshy (f64x2.splat (local.get $shy)))
    (local.set $vlow (f64x2.splat (f64.neg (local.get $near))))
    (local.set $vhighx (f64x2.splat (f64.add (f64.convert_i32_s (local.get $nx)) (local.get $near))))
    (local.set $vhighy (f64x2.splat (f64.add (f64.convert_i32_s (local.get $ny)) (local.get $near))))
    (local.set $vhalf (f64x2.splat (f64.const 0.5)))
    ;; |f - 0.5| > 0.5 - near  <=>  f < near or f > 1 - near, f the fractional part
    (local.set $vband (f64x2.splat (f64.sub (f64.const 0.5) (local.get $near))))
    (local.set $vnx (i32x4.splat (local.get $nx)))
    (local.set $p (local.get $pts))
    (local.set $end (i32.add (local.get $pts) (i32.shl (local.get $pairs) (i32.const 5))))
    (block $done
      (br_if $done (i32.ge_u (local.get $p) (local.get $end)))
      (loop $pair
        (local.set $a (v128.load (local.get $p)))
        (local.set $b (v128.load offset=16 (local.get $p)))
        ;; dx = (x0 - Ox, x1 - Ox), dy = (y0 - Oy, y1 - Oy)
        (local.set $dx (f64x2.sub (i8x16.shuffle 0 1 2 3 4 5 6 7 16 17 18 19 20 21 22 23 (local.get $a) (local.get $b)) (local.get $vox)))
        (local.set $dy (f64x2.sub (i8x16.shuffle 8 9 10 11 12 13 14 15 24 25 26 27 28 29 30 31 (local.get $a) (local.get $b)) (local.get $voy)))
        (local.set $x (f64x2.sub (f64x2.add (f64x2.mul (local.get $dx) (local.get $vcs)) (f64x2.mul (local.get $dy) (local.get $vsn))) (local.get $vshx)))
        (local.set $y (f64x2.sub (f64x2.sub (f64x2.mul (local.get $dy) (local.get $vcs)) (f64x2.mul (local.get $dx) (local.get $vsn))) (local.get $vshy)))
        (local.set $in (v128.and
          (v128.and (f64x2.gt (local.get $x) (local.get $vlow)) (f64x2.lt (local.get $x) (local.get $vhighx)))
          (v128.and (f64x2.gt (local.get $y) (local.get $vlow)) (f64x2.lt (local.get $y) (local.get $vhighy)))))
        (local.set $xi (i32x4.trunc_sat_f64x2_s_zero (local.get $x)))
        (local.set $yi (i32x4.trunc_sat_f64x2_s_zero (local.get $y)))
        (local.set $near-line (v128.or
          (f64x2.gt (f64x2.abs (f64x2.sub (f64x2.sub (local.get $x) (f64x2.convert_low_i32x4_s (local.get $xi))) (local.get $vhalf))) (local.get $vband))
          (f64x2.gt (f64x2.abs (f64x2.sub (f64x2.sub (local.get $y) (f64x2.convert_low_i32x4_s (local.get $yi))) (local.get $vhalf))) (local.get $vband))))
        ;; byte offsets of the cells: 4 * (j * nx + i), lanes 0 and 1
        (local.set $index (i32x4.shl (i32x4.add (i32x4.mul (local.get $yi) (local.get $vnx)) (local.get $xi)) (i32.const 2)))
        ;; mask bits: 1 and 2 for points 0 and 1 in the band, 4 and 8 for points 0 and 1 in the band near a line
        (local.set $mask (i32.or (i64x2.bitmask (local.get $in))
                                 (i32.shl (i64x2.bitmask (v128.and (local.get $in) (local.get $near-line))) (i32.const 2))))
        (if (i32.eq (local.get $mask) (i32.const 3))
          (then
            (local.set $addr (i32.add (local.get $out) (i32x4.extract_lane 0 (local.get $index))))
            (i32.store (local.get $addr) (i32.add (i32.load (local.get $addr)) (i32.const 1)))
            (local.set $addr (i32.add (local.get $out) (i32x4.extract_lane 1 (local.get $index))))
            (i32.store (local.get $addr) (i32.add (i32.load (local.get $addr)) (i32.const 1))))
          (else
            (if (i32.and (local.get $mask) (i32.const 4))
              (then
                (i32.store (i32.add (local.get $def) (i32.shl (local.get $nd) (i32.const 2))) (local.get $k))
                (local.set $nd (i32.add (local.get $nd) (i32.const 1))))
              (else
                (if (i32.and (local.get $mask) (i32.const 1))
                  (then
                    (local.set $addr (i32.add (local.get $out) (i32x4.extract_lane 0 (local.get $index))))
                    (i32.store (local.get $addr) (i32.add (i32.load (local.get $addr)) (i32.const 1)))))))
            (if (i32.and (local.get $mask) (i32.const 8))
              (then
                (i32.store (i32.add (local.get $def) (i32.shl (local.get $nd) (i32.const 2))) (i32.add (local.get $k) (i32.const 1)))
                (local.set $nd (i32.add (local.get $nd) (i32.const 1))))
              (else
                (if (i32.and (local.get $mask) (i32.const 2))
                  (then
                    (local.set $addr (i32.add (local.get $out) (i32x4.extract_lane 1 (local.get $index))))
                    (i32.store (local.get $addr) (i32.add (i32.load (local.get $addr)) (i32.const 1)))))))))
        (local.set $k (i32.add (local.get $k) (i32.const 2)))
        (local.set $p (i32.add (local.get $p) (i32.const 32)))
        (br_if $pair (i32.lt_u (local.get $p) (local.get $end)))))
    (local.get $nd))

  ;; Exact pass: the contract's formula for the $count points whose indices (0-based from $pts) are listed at $def,
  ;; counted into the int32 cells at $out when inside the nx x ny grid.
  (func (export "exactPass") (param $pts i32) (param $def i32) (param $count i32) (param $out i32)
        (param $ox f64) (param $oy f64) (param $cos f64) (param $sin f64) (param $s f64) (param $u f64) (param $v f64)
        (param $i0 i32) (param $j0 i32) (param $nx i32) (param $ny i32)
    (local $k i32) (local $p i32) (local $dx f64) (local $dy f64) (local $fi f64) (local $fj f64) (local $addr i32)
    (block $done
      (br_if $done (i32.le_s (local.get $count) (i32.const 0)))
      (loop $point
        (local.set $p (i32.add (local.get $pts) (i32.shl (i32.load (i32.add (local.get $def) (i32.shl (local.get $k) (i32.const 2)))) (i32.const 4))))
        (local.set $dx (f64.sub (f64.load (local.get $p)) (local.get $ox)))
        (local.set $dy (f64.sub (f64.load offset=8 (local.get $p)) (local.get $oy)))
        ;; the cell's offsets in float64, as JavaScript subtracts them: a NaN or far point fails the range test
        (local.set $fi (f64.sub (f64.floor (f64.sub
          (f64.div (f64.add (f64.mul (local.get $dx) (local.get $cos)) (f64.mul (local.get $dy) (local.get $sin))) (local.get $s))
          (local.get $u))) (f64.convert_i32_s (local.get $i0))))
        (local.set $fj (f64.sub (f64.floor (f64.sub
          (f64.div (f64.add (f64.mul (f64.neg (local.get $dx)) (local.get $sin)) (f64.mul (local.get $dy) (local.get $cos))) (local.get $s))
          (local.get $v))) (f64.convert_i32_s (local.get $j0))))
        (if (i32.and (i32.and (f64.ge (local.get $fi) (f64.const 0)) (f64.lt (local.get $fi) (f64.convert_i32_s (local.get $nx))))
                     (i32.and (f64.ge (local.get $fj) (f64.const 0)) (f64.lt (local.get $fj) (f64.convert_i32_s (local.get $ny)))))
          (then
            (local.set $addr (i32.add (local.get $out) (i32.shl (i32.add
              (i32.mul (i32.trunc_f64_s (local.get $fj)) (local.get $nx)) (i32.trunc_f64_s (local.get $fi))) (i32.const 2))))
            (i32.store (local.get $addr) (i32.add (i32.load (local.get $addr)) (i32.const 1)))))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br_if $point (i32.lt_s (local.get $k) (local.get $count))))))
)
