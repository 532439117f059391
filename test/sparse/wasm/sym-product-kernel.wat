(module
  (type (;0;) (func (param i32 i32 i32 i32 i32 i32 i32)))
  (import "k" "memory" (memory (;0;) 1 65536 shared))
  (func (;0;) (type 0) (param i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128)
    local.get 3
    local.set 7
    local.get 0
    local.get 7
    i32.const 4
    i32.mul
    i32.add
    local.set 8
    local.get 4
    local.get 3
    i32.sub
    local.set 14
    block  ;; label = @1
      loop  ;; label = @2
        local.get 14
        i32.eqz
        br_if 1 (;@1;)
        local.get 1
        local.get 8
        i32.load
        i32.const 4
        i32.mul
        i32.add
        local.set 9
        local.get 1
        local.get 8
        i32.load offset=4
        i32.const 4
        i32.mul
        i32.add
        local.set 10
        local.get 2
        local.get 8
        i32.load
        i32.const 8
        i32.mul
        i32.add
        local.set 11
        local.get 5
        local.get 7
        i32.const 16
        i32.mul
        i32.add
        local.set 12
        local.get 12
        v128.load align=8
        local.set 15
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 16
        block  ;; label = @3
          local.get 9
          local.get 10
          i32.ge_u
          br_if 0 (;@3;)
          local.get 9
          i32.load
          local.get 7
          i32.ne
          br_if 0 (;@3;)
          local.get 11
          v128.load64_splat
          local.set 17
          local.get 16
          local.get 17
          local.get 15
          f64x2.mul
          f64x2.add
          local.set 16
          local.get 9
          i32.const 4
          i32.add
          local.set 9
          local.get 11
          i32.const 8
          i32.add
          local.set 11
        end
        block  ;; label = @3
          loop  ;; label = @4
            local.get 9
            local.get 10
            i32.ge_u
            br_if 1 (;@3;)
            local.get 9
            i32.load
            i32.const 16
            i32.mul
            local.set 13
            local.get 11
            v128.load64_splat
            local.set 17
            local.get 6
            local.get 13
            i32.add
            local.get 6
            local.get 13
            i32.add
            v128.load align=8
            local.get 17
            local.get 15
            f64x2.mul
            f64x2.add
            v128.store align=8
            local.get 5
            local.get 13
            i32.add
            v128.load align=8
            local.set 18
            local.get 16
            local.get 17
            local.get 18
            f64x2.mul
            f64x2.add
            local.set 16
            local.get 9
            i32.const 4
            i32.add
            local.set 9
            local.get 11
            i32.const 8
            i32.add
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.get 7
        i32.const 16
        i32.mul
        i32.add
        local.set 12
        local.get 12
        local.get 12
        v128.load align=8
        local.get 16
        f64x2.add
        v128.store align=8
        local.get 8
        i32.const 4
        i32.add
        local.set 8
        local.get 7
        i32.const 1
        i32.add
        local.set 7
        local.get 14
        i32.const 1
        i32.sub
        local.set 14
        br 0 (;@2;)
      end
    end)
  (func (;1;) (type 0) (param i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128)
    local.get 3
    local.set 7
    local.get 0
    local.get 7
    i32.const 4
    i32.mul
    i32.add
    local.set 8
    local.get 4
    local.get 3
    i32.sub
    local.set 14
    block  ;; label = @1
      loop  ;; label = @2
        local.get 14
        i32.eqz
        br_if 1 (;@1;)
        local.get 1
        local.get 8
        i32.load
        i32.const 4
        i32.mul
        i32.add
        local.set 9
        local.get 1
        local.get 8
        i32.load offset=4
        i32.const 4
        i32.mul
        i32.add
        local.set 10
        local.get 2
        local.get 8
        i32.load
        i32.const 8
        i32.mul
        i32.add
        local.set 11
        local.get 5
        local.get 7
        i32.const 32
        i32.mul
        i32.add
        local.set 12
        local.get 12
        v128.load align=8
        local.set 15
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 17
        local.get 12
        v128.load offset=16 align=8
        local.set 16
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 18
        block  ;; label = @3
          local.get 9
          local.get 10
          i32.ge_u
          br_if 0 (;@3;)
          local.get 9
          i32.load
          local.get 7
          i32.ne
          br_if 0 (;@3;)
          local.get 11
          v128.load64_splat
          local.set 19
          local.get 17
          local.get 19
          local.get 15
          f64x2.mul
          f64x2.add
          local.set 17
          local.get 18
          local.get 19
          local.get 16
          f64x2.mul
          f64x2.add
          local.set 18
          local.get 9
          i32.const 4
          i32.add
          local.set 9
          local.get 11
          i32.const 8
          i32.add
          local.set 11
        end
        block  ;; label = @3
          loop  ;; label = @4
            local.get 9
            local.get 10
            i32.ge_u
            br_if 1 (;@3;)
            local.get 9
            i32.load
            i32.const 32
            i32.mul
            local.set 13
            local.get 11
            v128.load64_splat
            local.set 19
            local.get 6
            local.get 13
            i32.add
            local.get 6
            local.get 13
            i32.add
            v128.load align=8
            local.get 19
            local.get 15
            f64x2.mul
            f64x2.add
            v128.store align=8
            local.get 5
            local.get 13
            i32.add
            v128.load align=8
            local.set 20
            local.get 17
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 17
            local.get 6
            local.get 13
            i32.add
            local.get 6
            local.get 13
            i32.add
            v128.load offset=16 align=8
            local.get 19
            local.get 16
            f64x2.mul
            f64x2.add
            v128.store offset=16 align=8
            local.get 5
            local.get 13
            i32.add
            v128.load offset=16 align=8
            local.set 20
            local.get 18
            local.get 19
            local.get 20
            f64x2.mul
            f64x2.add
            local.set 18
            local.get 9
            i32.const 4
            i32.add
            local.set 9
            local.get 11
            i32.const 8
            i32.add
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.get 7
        i32.const 32
        i32.mul
        i32.add
        local.set 12
        local.get 12
        local.get 12
        v128.load align=8
        local.get 17
        f64x2.add
        v128.store align=8
        local.get 12
        local.get 12
        v128.load offset=16 align=8
        local.get 18
        f64x2.add
        v128.store offset=16 align=8
        local.get 8
        i32.const 4
        i32.add
        local.set 8
        local.get 7
        i32.const 1
        i32.add
        local.set 7
        local.get 14
        i32.const 1
        i32.sub
        local.set 14
        br 0 (;@2;)
      end
    end)
  (func (;2;) (type 0) (param i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128)
    local.get 3
    local.set 7
    local.get 0
    local.get 7
    i32.const 4
    i32.mul
    i32.add
    local.set 8
    local.get 4
    local.get 3
    i32.sub
    local.set 14
    block  ;; label = @1
      loop  ;; label = @2
        local.get 14
        i32.eqz
        br_if 1 (;@1;)
        local.get 1
        local.get 8
        i32.load
        i32.const 4
        i32.mul
        i32.add
        local.set 9
        local.get 1
        local.get 8
        i32.load offset=4
        i32.const 4
        i32.mul
        i32.add
        local.set 10
        local.get 2
        local.get 8
        i32.load
        i32.const 8
        i32.mul
        i32.add
        local.set 11
        local.get 5
        local.get 7
        i32.const 48
        i32.mul
        i32.add
        local.set 12
        local.get 12
        v128.load align=8
        local.set 15
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 18
        local.get 12
        v128.load offset=16 align=8
        local.set 16
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 19
        local.get 12
        v128.load offset=32 align=8
        local.set 17
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 20
        block  ;; label = @3
          local.get 9
          local.get 10
          i32.ge_u
          br_if 0 (;@3;)
          local.get 9
          i32.load
          local.get 7
          i32.ne
          br_if 0 (;@3;)
          local.get 11
          v128.load64_splat
          local.set 21
          local.get 18
          local.get 21
          local.get 15
          f64x2.mul
          f64x2.add
          local.set 18
          local.get 19
          local.get 21
          local.get 16
          f64x2.mul
          f64x2.add
          local.set 19
          local.get 20
          local.get 21
          local.get 17
          f64x2.mul
          f64x2.add
          local.set 20
          local.get 9
          i32.const 4
          i32.add
          local.set 9
          local.get 11
          i32.const 8
          i32.add
          local.set 11
        end
        block  ;; label = @3
          loop  ;; label = @4
            local.get 9
            local.get 10
            i32.ge_u
            br_if 1 (;@3;)
            local.get 9
            i32.load
            i32.const 48
            i32.mul
            local.set 13
            local.get 11
            v128.load64_splat
            local.set 21
            local.get 6
            local.get 13
            i32.add
            local.get 6
            local.get 13
            i32.add
            v128.load align=8
            local.get 21
            local.get 15
            f64x2.mul
            f64x2.add
            v128.store align=8
            local.get 5
            local.get 13
            i32.add
            v128.load align=8
            local.set 22
            local.get 18
            local.get 21
            local.get 22
            f64x2.mul
            f64x2.add
            local.set 18
            local.get 6
            local.get 13
            i32.add
            local.get 6
            local.get 13
            i32.add
            v128.load offset=16 align=8
            local.get 21
            local.get 16
            f64x2.mul
            f64x2.add
            v128.store offset=16 align=8
            local.get 5
            local.get 13
            i32.add
            v128.load offset=16 align=8
            local.set 22
            local.get 19
            local.get 21
            local.get 22
            f64x2.mul
            f64x2.add
            local.set 19
            local.get 6
            local.get 13
            i32.add
            local.get 6
            local.get 13
            i32.add
            v128.load offset=32 align=8
            local.get 21
            local.get 17
            f64x2.mul
            f64x2.add
            v128.store offset=32 align=8
            local.get 5
            local.get 13
            i32.add
            v128.load offset=32 align=8
            local.set 22
            local.get 20
            local.get 21
            local.get 22
            f64x2.mul
            f64x2.add
            local.set 20
            local.get 9
            i32.const 4
            i32.add
            local.set 9
            local.get 11
            i32.const 8
            i32.add
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.get 7
        i32.const 48
        i32.mul
        i32.add
        local.set 12
        local.get 12
        local.get 12
        v128.load align=8
        local.get 18
        f64x2.add
        v128.store align=8
        local.get 12
        local.get 12
        v128.load offset=16 align=8
        local.get 19
        f64x2.add
        v128.store offset=16 align=8
        local.get 12
        local.get 12
        v128.load offset=32 align=8
        local.get 20
        f64x2.add
        v128.store offset=32 align=8
        local.get 8
        i32.const 4
        i32.add
        local.set 8
        local.get 7
        i32.const 1
        i32.add
        local.set 7
        local.get 14
        i32.const 1
        i32.sub
        local.set 14
        br 0 (;@2;)
      end
    end)
  (export "s1" (func 0))
  (export "s2" (func 1))
  (export "s3" (func 2)))
