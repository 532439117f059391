(module
  (type (;0;) (func (param i32 i32 i32 i32 i32)))
  (type (;1;) (func (param i32 i32 i32 i32 i32 i32 i32)))
  (type (;2;) (func (param i32 i32 i32 i32 i32 i32 i32 i32 i32)))
  (type (;3;) (func (param i32 i32 i32 i32)))
  (type (;4;) (func (param i32 i32 i32)))
  (import "k" "memory" (memory (;0;) 1 65536 shared))
  (func (;0;) (type 0) (param i32 i32 i32 i32 i32)
    (local i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    local.get 1
    local.set 6
    block  ;; label = @1
      loop  ;; label = @2
        local.get 4
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 7
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 8
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 9
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 10
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 11
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 12
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 13
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 14
        local.get 0
        local.get 2
        i32.const 5
        i32.shl
        i32.add
        local.set 5
        local.get 6
        local.set 1
        block  ;; label = @3
          loop  ;; label = @4
            local.get 0
            local.get 5
            i32.ge_u
            br_if 1 (;@3;)
            local.get 0
            v128.load align=8
            local.set 15
            local.get 0
            v128.load offset=16 align=8
            local.set 16
            local.get 1
            v128.load64_splat
            local.set 17
            local.get 7
            local.get 15
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 7
            local.get 8
            local.get 16
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 8
            local.get 1
            v128.load64_splat offset=8
            local.set 17
            local.get 9
            local.get 15
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 9
            local.get 10
            local.get 16
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 10
            local.get 1
            v128.load64_splat offset=16
            local.set 17
            local.get 11
            local.get 15
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 11
            local.get 12
            local.get 16
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 12
            local.get 1
            v128.load64_splat offset=24
            local.set 17
            local.get 13
            local.get 15
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 13
            local.get 14
            local.get 16
            local.get 17
            f64x2.mul
            f64x2.add
            local.set 14
            local.get 0
            i32.const 32
            i32.add
            local.set 0
            local.get 1
            i32.const 32
            i32.add
            local.set 1
            br 0 (;@4;)
          end
        end
        local.get 3
        local.get 7
        v128.store align=8
        local.get 3
        local.get 8
        v128.store offset=16 align=8
        local.get 3
        local.get 9
        v128.store offset=32 align=8
        local.get 3
        local.get 10
        v128.store offset=48 align=8
        local.get 3
        local.get 11
        v128.store offset=64 align=8
        local.get 3
        local.get 12
        v128.store offset=80 align=8
        local.get 3
        local.get 13
        v128.store offset=96 align=8
        local.get 3
        local.get 14
        v128.store offset=112 align=8
        local.get 3
        i32.const 128
        i32.add
        local.set 3
        local.get 4
        i32.const 1
        i32.sub
        local.set 4
        br 0 (;@2;)
      end
    end)
  (func (;1;) (type 1) (param i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 6
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 10
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 11
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 12
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 13
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 14
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 15
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 16
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 17
        local.get 0
        local.set 7
        local.get 3
        local.set 8
        local.get 2
        local.set 9
        block  ;; label = @3
          loop  ;; label = @4
            local.get 9
            i32.eqz
            br_if 1 (;@3;)
            local.get 7
            v128.load align=8
            local.set 18
            local.get 7
            v128.load offset=16 align=8
            local.set 19
            local.get 8
            v128.load64_splat
            local.set 20
            local.get 10
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 10
            local.get 11
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 11
            local.get 8
            v128.load64_splat offset=8
            local.set 20
            local.get 12
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 12
            local.get 13
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 13
            local.get 8
            v128.load64_splat offset=16
            local.set 20
            local.get 14
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 14
            local.get 15
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 15
            local.get 8
            v128.load64_splat offset=24
            local.set 20
            local.get 16
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 16
            local.get 17
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 17
            local.get 7
            local.get 1
            i32.add
            local.set 7
            local.get 8
            i32.const 32
            i32.add
            local.set 8
            local.get 9
            i32.const 1
            i32.sub
            local.set 9
            br 0 (;@4;)
          end
        end
        local.get 4
        local.set 9
        local.get 9
        local.get 9
        v128.load align=8
        local.get 10
        f64x2.sub
        v128.store align=8
        local.get 9
        local.get 9
        v128.load offset=16 align=8
        local.get 11
        f64x2.sub
        v128.store offset=16 align=8
        local.get 9
        local.get 5
        i32.add
        local.set 9
        local.get 9
        local.get 9
        v128.load align=8
        local.get 12
        f64x2.sub
        v128.store align=8
        local.get 9
        local.get 9
        v128.load offset=16 align=8
        local.get 13
        f64x2.sub
        v128.store offset=16 align=8
        local.get 9
        local.get 5
        i32.add
        local.set 9
        local.get 9
        local.get 9
        v128.load align=8
        local.get 14
        f64x2.sub
        v128.store align=8
        local.get 9
        local.get 9
        v128.load offset=16 align=8
        local.get 15
        f64x2.sub
        v128.store offset=16 align=8
        local.get 9
        local.get 5
        i32.add
        local.set 9
        local.get 9
        local.get 9
        v128.load align=8
        local.get 16
        f64x2.sub
        v128.store align=8
        local.get 9
        local.get 9
        v128.load offset=16 align=8
        local.get 17
        f64x2.sub
        v128.store offset=16 align=8
        local.get 0
        i32.const 32
        i32.add
        local.set 0
        local.get 4
        i32.const 32
        i32.add
        local.set 4
        local.get 6
        i32.const 1
        i32.sub
        local.set 6
        br 0 (;@2;)
      end
    end)
  (func (;2;) (type 1) (param i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 6
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 10
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 11
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 12
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 13
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 14
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 15
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 16
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 17
        local.get 0
        local.set 7
        local.get 3
        local.set 8
        local.get 2
        local.set 9
        block  ;; label = @3
          loop  ;; label = @4
            local.get 9
            i32.eqz
            br_if 1 (;@3;)
            local.get 7
            v128.load align=8
            local.set 18
            local.get 7
            v128.load offset=16 align=8
            local.set 19
            local.get 8
            v128.load64_splat
            local.set 20
            local.get 10
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 10
            local.get 11
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 11
            local.get 8
            v128.load64_splat offset=8
            local.set 20
            local.get 12
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 12
            local.get 13
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 13
            local.get 8
            v128.load64_splat offset=16
            local.set 20
            local.get 14
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 14
            local.get 15
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 15
            local.get 8
            v128.load64_splat offset=24
            local.set 20
            local.get 16
            local.get 18
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 16
            local.get 17
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 17
            local.get 7
            local.get 1
            i32.add
            local.set 7
            local.get 8
            i32.const 32
            i32.add
            local.set 8
            local.get 9
            i32.const 1
            i32.sub
            local.set 9
            br 0 (;@4;)
          end
        end
        local.get 4
        local.set 9
        local.get 9
        local.get 10
        f64x2.neg
        v128.store align=8
        local.get 9
        local.get 11
        f64x2.neg
        v128.store offset=16 align=8
        local.get 9
        local.get 5
        i32.add
        local.set 9
        local.get 9
        local.get 12
        f64x2.neg
        v128.store align=8
        local.get 9
        local.get 13
        f64x2.neg
        v128.store offset=16 align=8
        local.get 9
        local.get 5
        i32.add
        local.set 9
        local.get 9
        local.get 14
        f64x2.neg
        v128.store align=8
        local.get 9
        local.get 15
        f64x2.neg
        v128.store offset=16 align=8
        local.get 9
        local.get 5
        i32.add
        local.set 9
        local.get 9
        local.get 16
        f64x2.neg
        v128.store align=8
        local.get 9
        local.get 17
        f64x2.neg
        v128.store offset=16 align=8
        local.get 0
        i32.const 32
        i32.add
        local.set 0
        local.get 4
        i32.const 32
        i32.add
        local.set 4
        local.get 6
        i32.const 1
        i32.sub
        local.set 6
        br 0 (;@2;)
      end
    end)
  (func (;3;) (type 2) (param i32 i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 6
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 14
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 15
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 16
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 17
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 18
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 19
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 20
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 21
        local.get 0
        local.set 9
        local.get 3
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 9
            v128.load align=8
            local.set 22
            local.get 9
            v128.load offset=16 align=8
            local.set 23
            local.get 10
            v128.load64_splat
            local.set 24
            local.get 14
            local.get 22
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 14
            local.get 15
            local.get 23
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 15
            local.get 10
            v128.load64_splat offset=8
            local.set 24
            local.get 16
            local.get 22
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 16
            local.get 17
            local.get 23
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 17
            local.get 10
            v128.load64_splat offset=16
            local.set 24
            local.get 18
            local.get 22
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 18
            local.get 19
            local.get 23
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 19
            local.get 10
            v128.load64_splat offset=24
            local.set 24
            local.get 20
            local.get 22
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 20
            local.get 21
            local.get 23
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 21
            local.get 9
            local.get 1
            i32.add
            local.set 9
            local.get 10
            i32.const 32
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        i32.const 4
        local.set 13
        block  ;; label = @3
          local.get 6
          i32.const 1
          i32.ne
          br_if 0 (;@3;)
          local.get 7
          local.set 13
        end
        local.get 4
        local.set 12
        block  ;; label = @3
          i32.const 0
          local.get 8
          i32.ge_u
          br_if 0 (;@3;)
          block  ;; label = @4
            i32.const 0
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load
            local.get 14
            f64x2.extract_lane 0
            f64.sub
            f64.store
            i32.const 1
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=8
            local.get 14
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=8
            i32.const 2
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=16
            local.get 15
            f64x2.extract_lane 0
            f64.sub
            f64.store offset=16
            i32.const 3
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=24
            local.get 15
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=24
          end
          local.get 12
          local.get 5
          i32.add
          local.set 12
          i32.const 1
          local.get 8
          i32.ge_u
          br_if 0 (;@3;)
          block  ;; label = @4
            i32.const 0
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load
            local.get 16
            f64x2.extract_lane 0
            f64.sub
            f64.store
            i32.const 1
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=8
            local.get 16
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=8
            i32.const 2
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=16
            local.get 17
            f64x2.extract_lane 0
            f64.sub
            f64.store offset=16
            i32.const 3
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=24
            local.get 17
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=24
          end
          local.get 12
          local.get 5
          i32.add
          local.set 12
          i32.const 2
          local.get 8
          i32.ge_u
          br_if 0 (;@3;)
          block  ;; label = @4
            i32.const 0
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load
            local.get 18
            f64x2.extract_lane 0
            f64.sub
            f64.store
            i32.const 1
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=8
            local.get 18
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=8
            i32.const 2
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=16
            local.get 19
            f64x2.extract_lane 0
            f64.sub
            f64.store offset=16
            i32.const 3
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=24
            local.get 19
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=24
          end
          local.get 12
          local.get 5
          i32.add
          local.set 12
          i32.const 3
          local.get 8
          i32.ge_u
          br_if 0 (;@3;)
          block  ;; label = @4
            i32.const 0
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load
            local.get 20
            f64x2.extract_lane 0
            f64.sub
            f64.store
            i32.const 1
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=8
            local.get 20
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=8
            i32.const 2
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=16
            local.get 21
            f64x2.extract_lane 0
            f64.sub
            f64.store offset=16
            i32.const 3
            local.get 13
            i32.ge_u
            br_if 0 (;@4;)
            local.get 12
            local.get 12
            f64.load offset=24
            local.get 21
            f64x2.extract_lane 1
            f64.sub
            f64.store offset=24
          end
          local.get 12
          local.get 5
          i32.add
          local.set 12
        end
        local.get 0
        i32.const 32
        i32.add
        local.set 0
        local.get 4
        i32.const 32
        i32.add
        local.set 4
        local.get 6
        i32.const 1
        i32.sub
        local.set 6
        br 0 (;@2;)
      end
    end)
  (func (;4;) (type 1) (param i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 2
        i32.eqz
        br_if 1 (;@1;)
        block  ;; label = @3
          loop  ;; label = @4
            local.get 3
            local.get 4
            local.get 7
            i32.const 3
            i32.shl
            i32.add
            i32.load offset=8
            i32.ge_u
            i32.eqz
            br_if 1 (;@3;)
            local.get 7
            i32.const 1
            i32.add
            local.set 7
            br 0 (;@4;)
          end
        end
        local.get 6
        i32.load
        local.set 14
        local.get 7
        local.set 8
        local.get 3
        local.set 9
        block  ;; label = @3
          loop  ;; label = @4
            local.get 8
            local.get 5
            i32.ge_u
            br_if 1 (;@3;)
            local.get 4
            local.get 8
            i32.const 3
            i32.shl
            i32.add
            i32.load offset=8
            local.set 10
            local.get 14
            local.get 4
            local.get 8
            i32.const 3
            i32.shl
            i32.add
            i32.load offset=4
            i32.add
            local.get 9
            i32.const 3
            i32.shl
            i32.add
            local.set 11
            local.get 0
            local.get 9
            i32.const 3
            i32.shl
            i32.add
            local.set 12
            local.get 10
            local.get 9
            i32.sub
            local.set 13
            block  ;; label = @5
              loop  ;; label = @6
                i32.const 1
                local.get 13
                i32.ge_u
                br_if 1 (;@5;)
                local.get 11
                local.get 11
                v128.load align=8
                local.get 12
                v128.load align=8
                f64x2.add
                v128.store align=8
                local.get 11
                i32.const 16
                i32.add
                local.set 11
                local.get 12
                i32.const 16
                i32.add
                local.set 12
                local.get 13
                i32.const 2
                i32.sub
                local.set 13
                br 0 (;@6;)
              end
            end
            block  ;; label = @5
              local.get 13
              i32.eqz
              br_if 0 (;@5;)
              local.get 11
              local.get 11
              f64.load
              local.get 12
              f64.load
              f64.add
              f64.store
            end
            local.get 10
            local.set 9
            local.get 8
            i32.const 1
            i32.add
            local.set 8
            br 0 (;@4;)
          end
        end
        local.get 6
        i32.const 4
        i32.add
        local.set 6
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 3
        i32.const 1
        i32.add
        local.set 3
        local.get 2
        i32.const 1
        i32.sub
        local.set 2
        br 0 (;@2;)
      end
    end)
  (func (;5;) (type 3) (param i32 i32 i32 i32)
    (local v128)
    local.get 3
    v128.load64_splat
    local.set 4
    block  ;; label = @1
      loop  ;; label = @2
        i32.const 1
        local.get 2
        i32.ge_u
        br_if 1 (;@1;)
        local.get 0
        local.get 0
        v128.load align=8
        local.get 1
        v128.load align=8
        local.get 4
        f64x2.mul
        f64x2.sub
        v128.store align=8
        local.get 1
        i32.const 16
        i32.add
        local.set 1
        local.get 0
        i32.const 16
        i32.add
        local.set 0
        local.get 2
        i32.const 2
        i32.sub
        local.set 2
        br 0 (;@2;)
      end
    end
    block  ;; label = @1
      local.get 2
      i32.eqz
      br_if 0 (;@1;)
      local.get 0
      local.get 0
      f64.load
      local.get 1
      v128.load64_splat
      local.get 4
      f64x2.mul
      f64x2.extract_lane 0
      f64.sub
      f64.store
    end)
  (func (;6;) (type 4) (param i32 i32 i32)
    (local v128)
    local.get 2
    v128.load64_splat
    local.set 3
    block  ;; label = @1
      loop  ;; label = @2
        i32.const 1
        local.get 1
        i32.ge_u
        br_if 1 (;@1;)
        local.get 0
        local.get 0
        v128.load align=8
        local.get 3
        f64x2.mul
        v128.store align=8
        local.get 0
        i32.const 16
        i32.add
        local.set 0
        local.get 1
        i32.const 2
        i32.sub
        local.set 1
        br 0 (;@2;)
      end
    end
    block  ;; label = @1
      local.get 1
      i32.eqz
      br_if 0 (;@1;)
      local.get 0
      local.get 0
      v128.load64_splat
      local.get 3
      f64x2.mul
      f64x2.extract_lane 0
      f64.store
    end)
  (export "tiles" (func 0))
  (export "sub" (func 1))
  (export "put" (func 2))
  (export "edge" (func 3))
  (export "scatter" (func 4))
  (export "subScaled" (func 5))
  (export "scale" (func 6)))
