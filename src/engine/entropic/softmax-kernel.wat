;; The WebAssembly SIMD (f64x2) half of TruncatedSoftmax (truncated-softmax.ts): the product pass and the weighted
;; average, with the same float64 operations in the same order as the TypeScript kernel there (no fused multiply-add),
;; so both give the same bits. Assembled by `npm run build:wasm` into softmax-wasm.ts; the memory comes from the caller.
;; All pointers are byte offsets into that memory.
(module
  (import "env" "memory" (memory 1))

  ;; One chunk of the product pass for two rows at once, lanes = the two rows:
  ;;   t_j = s_j + ((a0 y0 + a1 y1) + (a2 y2 + a3 y3)) + ((a4 y4 + a5 y5) + (a6 y6 + a7 y7))   (width 8)
  ;;   t_j = s_j + ((a0 y0 + a1 y1) + (a2 y2 + a3 y3))                                          (width 4)
  ;; a_k = (-2 x_k of row 0, -2 x_k of row 1) at $xv + 16 k, y_jk at $yc + 8 (width j + k), s_j = c_j (f64 at $c + 8 j)
  ;; in the first chunk and the pair at $dist + 16 j after it. A chunk before the last stores t_j at $dist + 16 j; the
  ;; last keeps each lane's running minimum b and lists the candidates t_j <= b + band (index into $cand0 / $cand1 as
  ;; i32, value into $vals0 / $vals1), then writes the two counts (i32) at $head, $head + 4 and the two minima (f64)
  ;; at $head + 8, $head + 16.
  (func (export "pass")
    (param $width i32) (param $m i32) (param $yc i32) (param $xv i32) (param $c i32) (param $dist i32)
    (param $first i32) (param $last i32) (param $band f64)
    (param $cand0 i32) (param $cand1 i32) (param $vals0 i32) (param $vals1 i32) (param $head i32)
    (local $j i32) (local $p i32) (local $s v128) (local $t v128) (local $b v128) (local $bandv v128)
    (local $n0 i32) (local $n1 i32) (local $mask i32)
    (local $a0 v128) (local $a1 v128) (local $a2 v128) (local $a3 v128)
    (local $a4 v128) (local $a5 v128) (local $a6 v128) (local $a7 v128)
    (local.set $a0 (v128.load offset=0 (local.get $xv)))
    (local.set $a1 (v128.load offset=16 (local.get $xv)))
    (local.set $a2 (v128.load offset=32 (local.get $xv)))
    (local.set $a3 (v128.load offset=48 (local.get $xv)))
    (if (i32.eq (local.get $width) (i32.const 8))
      (then
        (local.set $a4 (v128.load offset=64 (local.get $xv)))
        (local.set $a5 (v128.load offset=80 (local.get $xv)))
        (local.set $a6 (v128.load offset=96 (local.get $xv)))
        (local.set $a7 (v128.load offset=112 (local.get $xv)))))
    (local.set $b (f64x2.splat (f64.const inf)))
    (local.set $bandv (f64x2.splat (local.get $band)))
    (local.set $p (local.get $yc))
    (block $done
      (br_if $done (i32.eqz (local.get $m)))
      (loop $next
        (if (local.get $first)
          (then (local.set $s (v128.load64_splat (i32.add (local.get $c) (i32.shl (local.get $j) (i32.const 3))))))
          (else (local.set $s (v128.load (i32.add (local.get $dist) (i32.shl (local.get $j) (i32.const 4)))))))
        (if (i32.eq (local.get $width) (i32.const 8))
          (then
            (local.set $t
              (f64x2.add (local.get $s)
                (f64x2.add
                  (f64x2.add
                    (f64x2.add
                      (f64x2.mul (local.get $a0) (v128.load64_splat offset=0 (local.get $p)))
                      (f64x2.mul (local.get $a1) (v128.load64_splat offset=8 (local.get $p))))
                    (f64x2.add
                      (f64x2.mul (local.get $a2) (v128.load64_splat offset=16 (local.get $p)))
                      (f64x2.mul (local.get $a3) (v128.load64_splat offset=24 (local.get $p)))))
                  (f64x2.add
                    (f64x2.add
                      (f64x2.mul (local.get $a4) (v128.load64_splat offset=32 (local.get $p)))
                      (f64x2.mul (local.get $a5) (v128.load64_splat offset=40 (local.get $p))))
                    (f64x2.add
                      (f64x2.mul (local.get $a6) (v128.load64_splat offset=48 (local.get $p)))
                      (f64x2.mul (local.get $a7) (v128.load64_splat offset=56 (local.get $p))))))))
            (local.set $p (i32.add (local.get $p) (i32.const 64))))
          (else
            (local.set $t
              (f64x2.add (local.get $s)
                (f64x2.add
                  (f64x2.add
                    (f64x2.mul (local.get $a0) (v128.load64_splat offset=0 (local.get $p)))
                    (f64x2.mul (local.get $a1) (v128.load64_splat offset=8 (local.get $p))))
                  (f64x2.add
                    (f64x2.mul (local.get $a2) (v128.load64_splat offset=16 (local.get $p)))
                    (f64x2.mul (local.get $a3) (v128.load64_splat offset=24 (local.get $p)))))))
            (local.set $p (i32.add (local.get $p) (i32.const 32)))))
        (if (local.get $last)
          (then
            (local.set $b (f64x2.pmin (local.get $b) (local.get $t)))
            (local.set $mask (i64x2.bitmask (f64x2.le (local.get $t) (f64x2.add (local.get $b) (local.get $bandv)))))
            (i32.store (i32.add (local.get $cand0) (i32.shl (local.get $n0) (i32.const 2))) (local.get $j))
            (f64.store (i32.add (local.get $vals0) (i32.shl (local.get $n0) (i32.const 3))) (f64x2.extract_lane 0 (local.get $t)))
            (i32.store (i32.add (local.get $cand1) (i32.shl (local.get $n1) (i32.const 2))) (local.get $j))
            (f64.store (i32.add (local.get $vals1) (i32.shl (local.get $n1) (i32.const 3))) (f64x2.extract_lane 1 (local.get $t)))
            (local.set $n0 (i32.add (local.get $n0) (i32.and (local.get $mask) (i32.const 1))))
            (local.set $n1 (i32.add (local.get $n1) (i32.shr_u (local.get $mask) (i32.const 1)))))
          (else (v128.store (i32.add (local.get $dist) (i32.shl (local.get $j) (i32.const 4))) (local.get $t))))
        (local.set $j (i32.add (local.get $j) (i32.const 1)))
        (br_if $next (i32.lt_u (local.get $j) (local.get $m)))))
    (i32.store offset=0 (local.get $head) (local.get $n0))
    (i32.store offset=4 (local.get $head) (local.get $n1))
    (f64.store offset=8 (local.get $head) (f64x2.extract_lane 0 (local.get $b)))
    (f64.store offset=16 (local.get $head) (f64x2.extract_lane 1 (local.get $b))))

  ;; tableExpWeights of truncated-softmax.ts, operation for operation, two candidates at a time (lanes = candidates t, t + 1):
  ;; weight_t = exp((top - vals_t) scale) from the table (at $table, its end at -64 $floor) and a degree-5 polynomial,
  ;; into $weight. vals_count is first set to top (both arrays have room for one more), so that with an odd count the last
  ;; pair's second lane computes exp(0) into weight_count, which is never read. `sums` takes the weights' sum, in t order.
  (func (export "weights")
    (param $vals i32) (param $count i32) (param $top f64) (param $scale f64) (param $table i32) (param $floor f64)
    (param $weight i32)
    (local $t i32) (local $z v128) (local $kd v128) (local $k v128) (local $r v128) (local $r2 v128) (local $e v128)
    (local $topv v128) (local $scalev v128) (local $floorv v128)
    (local.set $topv (f64x2.splat (local.get $top)))
    (local.set $scalev (f64x2.splat (local.get $scale)))
    (local.set $floorv (f64x2.splat (local.get $floor)))
    (f64.store (i32.add (local.get $vals) (i32.shl (local.get $count) (i32.const 3))) (local.get $top))
    (block $done
      (br_if $done (i32.le_s (local.get $count) (i32.const 0)))
      (loop $next
        (local.set $z (f64x2.mul (f64x2.sub (local.get $topv) (v128.load (i32.add (local.get $vals) (i32.shl (local.get $t) (i32.const 3)))))
          (local.get $scalev)))
        ;; z > floor ? z : floor
        (local.set $z (f64x2.pmax (local.get $floorv) (local.get $z)))
;; k = trunc(-64 z), an integer in [0, table length), as a float; its bits plus 2^52 hold it as an integer in the low word
        (local.set $kd (f64x2.trunc (f64x2.mul (local.get $z) (f64x2.splat (f64.const -64)))))
        (local.set $k (f64x2.add (local.get $kd) (f64x2.splat (f64.const 0x1p52))))
        (local.set $r (f64x2.add (local.get $z) (f64x2.mul (local.get $kd) (f64x2.splat (f64.const 0.015625)))))
        (local.set $r2 (f64x2.mul (local.get $r) (local.get $r)))
        (local.set $e
          (v128.load64_lane 1
            (i32.add (local.get $table) (i32.shl (i32x4.extract_lane 2 (local.get $k)) (i32.const 3)))
            (v128.load64_splat (i32.add (local.get $table) (i32.shl (i32x4.extract_lane 0 (local.get $k)) (i32.const 3))))))
        (v128.store (i32.add (local.get $weight) (i32.shl (local.get $t) (i32.const 3)))
          (f64x2.mul (local.get $e)
            (f64x2.add (f64x2.add (f64x2.splat (f64.const 1)) (local.get $r))
              (f64x2.mul (local.get $r2)
                (f64x2.add (f64x2.add (f64x2.splat (f64.const 0.5)) (f64x2.mul (local.get $r) (f64x2.splat (f64.const 0x1.5555555555555p-3))))
                  (f64x2.mul (local.get $r2)
                    (f64x2.add (f64x2.splat (f64.const 0x1.5555555555555p-5))
                      (f64x2.mul (local.get $r) (f64x2.splat (f64.const 0x1.1111111111111p-7))))))))))
        (local.set $t (i32.add (local.get $t) (i32.const 2)))
        (br_if $next (i32.lt_s (local.get $t) (local.get $count))))))

  ;; sums_k = sum_t weight_t y_(cand_t) k in t order, lanes = coordinates (k, k + 1), for one chunk of width 8 or 4
  ;; (rows of $width f64 at $yc); the width sums go to $out, and the sum of the weights, in t order, is returned.
  (func (export "sums")
    (param $width i32) (param $yc i32) (param $cand i32) (param $weight i32) (param $count i32) (param $out i32)
    (result f64)
    (local $t i32) (local $w v128) (local $p i32) (local $total f64)
    (local $s0 v128) (local $s1 v128) (local $s2 v128) (local $s3 v128)
    (block $done
      (br_if $done (i32.le_s (local.get $count) (i32.const 0)))
      (if (i32.eq (local.get $width) (i32.const 8))
        (then
          (loop $next8
            (local.set $w (v128.load64_splat (i32.add (local.get $weight) (i32.shl (local.get $t) (i32.const 3)))))
            (local.set $p (i32.add (local.get $yc)
              (i32.shl (i32.load (i32.add (local.get $cand) (i32.shl (local.get $t) (i32.const 2)))) (i32.const 6))))
            (local.set $total (f64.add (local.get $total) (f64x2.extract_lane 0 (local.get $w))))
            (local.set $s0 (f64x2.add (local.get $s0) (f64x2.mul (local.get $w) (v128.load offset=0 (local.get $p)))))
            (local.set $s1 (f64x2.add (local.get $s1) (f64x2.mul (local.get $w) (v128.load offset=16 (local.get $p)))))
            (local.set $s2 (f64x2.add (local.get $s2) (f64x2.mul (local.get $w) (v128.load offset=32 (local.get $p)))))
            (local.set $s3 (f64x2.add (local.get $s3) (f64x2.mul (local.get $w) (v128.load offset=48 (local.get $p)))))
            (local.set $t (i32.add (local.get $t) (i32.const 1)))
            (br_if $next8 (i32.lt_s (local.get $t) (local.get $count)))))
        (else
          (loop $next4
            (local.set $w (v128.load64_splat (i32.add (local.get $weight) (i32.shl (local.get $t) (i32.const 3)))))
            (local.set $p (i32.add (local.get $yc)
              (i32.shl (i32.load (i32.add (local.get $cand) (i32.shl (local.get $t) (i32.const 2)))) (i32.const 5))))
            (local.set $total (f64.add (local.get $total) (f64x2.extract_lane 0 (local.get $w))))
            (local.set $s0 (f64x2.add (local.get $s0) (f64x2.mul (local.get $w) (v128.load offset=0 (local.get $p)))))
            (local.set $s1 (f64x2.add (local.get $s1) (f64x2.mul (local.get $w) (v128.load offset=16 (local.get $p)))))
            (local.set $t (i32.add (local.get $t) (i32.const 1)))
            (br_if $next4 (i32.lt_s (local.get $t) (local.get $count)))))))
    (v128.store offset=0 (local.get $out) (local.get $s0))
    (v128.store offset=16 (local.get $out) (local.get $s1))
    (v128.store offset=32 (local.get $out) (local.get $s2))
    (v128.store offset=48 (local.get $out) (local.get $s3))
    (local.get $total)))
