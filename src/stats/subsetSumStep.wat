;; The subset-sum step of the exact signed-rank distribution (signedRank.ts) in WebAssembly:
;;
;;   counts[w] += counts[w - shift]   for w from high down to low (low >= shift >= 1)
;;
;; on a table of doubles at byte offset `base` of this module's memory. Going down, every
;; counts[w - shift] is read before the step changes it, so the table afterwards holds the
;; distribution with one more score. Four entries are done at a time with 128-bit SIMD (two
;; doubles per f64x2.add), all four loads before either store: with shift 1, 2 or 3 the entries
;; read overlap the entries written, and reading first keeps the old values. The one to three
;; entries left at the bottom are done one at a time. Each entry receives the same single
;; addition as in the JavaScript loop (subsetSumStep.ts), so both give bit-identical tables.
;;
;; Addresses stay below 2 GiB (the memory's maximum), so signed comparisons are safe even when
;; `high - 3` is negative.
;;
;; Compiled by scripts/subsetSumWasm.ts into subsetSumStepBytes.ts (checked by
;; test/stats/subsetSumStep.test.ts). WebAssembly 2.0, section 4.4.4 (vector instructions).
(module
  (memory (export "memory") 1 32767)
  (func (export "step") (param $base i32) (param $low i32) (param $high i32) (param $shift i32)
    (local $at i32) (local $from i32) (local $end i32)
    (local $upperSum v128) (local $lowerSum v128)
    ;; $at: address of counts[w - 3] for the top w of the next four; $from: of counts[w - 3 - shift].
    (local.set $at (i32.add (local.get $base) (i32.shl (i32.sub (local.get $high) (i32.const 3)) (i32.const 3))))
    (local.set $from (i32.sub (local.get $at) (i32.shl (local.get $shift) (i32.const 3))))
    (local.set $end (i32.add (local.get $base) (i32.shl (local.get $low) (i32.const 3))))
    (block $fours_done
      (loop $fours
        (br_if $fours_done (i32.lt_s (local.get $at) (local.get $end)))
        (local.set $upperSum
          (f64x2.add (v128.load offset=16 (local.get $at)) (v128.load offset=16 (local.get $from))))
        (local.set $lowerSum
          (f64x2.add (v128.load (local.get $at)) (v128.load (local.get $from))))
        (v128.store offset=16 (local.get $at) (local.get $upperSum))
        (v128.store (local.get $at) (local.get $lowerSum))
        (local.set $at (i32.sub (local.get $at) (i32.const 32)))
        (local.set $from (i32.sub (local.get $from) (i32.const 32)))
        (br $fours)))
    ;; The rest one at a time: $at and $from now point at the highest entry not yet done.
    (local.set $at (i32.add (local.get $at) (i32.const 24)))
    (local.set $from (i32.add (local.get $from) (i32.const 24)))
    (block $ones_done
      (loop $ones
        (br_if $ones_done (i32.lt_s (local.get $at) (local.get $end)))
        (f64.store (local.get $at) (f64.add (f64.load (local.get $at)) (f64.load (local.get $from))))
        (local.set $at (i32.sub (local.get $at) (i32.const 8)))
        (local.set $from (i32.sub (local.get $from) (i32.const 8)))
        (br $ones)))))
