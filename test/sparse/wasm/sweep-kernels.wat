(module
  (type (;0;) (func (param i32 i32 i32 i32 i32 i32 i32 i32)))
  (type (;1;) (func (param i32 i32 i32 i32 i32 i32)))
  (type (;2;) (func (param i32 i32 i32 i32 i32 i32 i32 i32 i32)))
  (import "k" "memory" (memory (;0;) 1 65536 shared))
  (func (;0;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 2
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 14
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 15
        local.get 0
        local.set 8
        local.get 4
        local.set 9
        local.get 3
        local.set 10
        block  ;; label = @3
          loop  ;; label = @4
            local.get 10
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 16
            local.get 8
            v128.load offset=16 align=8
            local.set 17
            local.get 9
            v128.load64_splat
            local.set 18
            local.get 14
            local.get 16
            local.get 18
            f64x2.mul
            f64x2.add
            local.set 14
            local.get 15
            local.get 17
            local.get 18
            f64x2.mul
            f64x2.add
            local.set 15
            local.get 8
            local.get 1
            i32.add
            local.set 8
            local.get 9
            i32.const 8
            i32.add
            local.set 9
            local.get 10
            i32.const 1
            i32.sub
            local.set 10
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 13
        local.get 13
        local.get 13
        v128.load align=8
        local.get 14
        f64x2.sub
        v128.store align=8
        local.get 13
        local.get 13
        v128.load offset=16 align=8
        local.get 15
        f64x2.sub
        v128.store offset=16 align=8
        local.get 0
        i32.const 32
        i32.add
        local.set 0
        local.get 6
        i32.const 32
        i32.add
        local.set 6
        local.get 2
        i32.const 1
        i32.sub
        local.set 2
        br 0 (;@2;)
      end
    end)
  (func (;1;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 15
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 16
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 17
            local.get 9
            v128.load align=8
            local.set 18
            local.get 10
            v128.load align=8
            local.set 19
            local.get 15
            local.get 17
            local.get 19
            f64x2.mul
            f64x2.add
            local.set 15
            local.get 16
            local.get 18
            local.get 19
            f64x2.mul
            f64x2.add
            local.set 16
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 14
        local.get 14
        local.get 14
        f64.load
        local.get 15
        f64x2.extract_lane 0
        local.get 15
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 14
        local.get 14
        f64.load offset=8
        local.get 16
        f64x2.extract_lane 0
        local.get 16
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 16
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;2;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 15
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 16
            local.get 10
            v128.load align=8
            local.set 18
            local.get 15
            local.get 16
            local.get 18
            f64x2.mul
            f64x2.add
            local.set 15
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 14
        local.get 14
        local.get 14
        f64.load
        local.get 15
        f64x2.extract_lane 0
        local.get 15
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 8
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;3;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 12
    local.get 7
    i32.const 1
    i32.mul
    local.set 14
    block  ;; label = @1
      loop  ;; label = @2
        local.get 2
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 16
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 17
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 18
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 19
        local.get 0
        local.set 8
        local.get 4
        local.set 9
        local.get 3
        local.set 10
        block  ;; label = @3
          loop  ;; label = @4
            local.get 10
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 20
            local.get 8
            v128.load offset=16 align=8
            local.set 21
            local.get 9
            v128.load64_splat
            local.set 22
            local.get 16
            local.get 20
            local.get 22
            f64x2.mul
            f64x2.add
            local.set 16
            local.get 17
            local.get 21
            local.get 22
            f64x2.mul
            f64x2.add
            local.set 17
            local.get 9
            local.get 12
            i32.add
            v128.load64_splat
            local.set 22
            local.get 18
            local.get 20
            local.get 22
            f64x2.mul
            f64x2.add
            local.set 18
            local.get 19
            local.get 21
            local.get 22
            f64x2.mul
            f64x2.add
            local.set 19
            local.get 8
            local.get 1
            i32.add
            local.set 8
            local.get 9
            i32.const 8
            i32.add
            local.set 9
            local.get 10
            i32.const 1
            i32.sub
            local.set 10
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 15
        local.get 15
        local.get 15
        v128.load align=8
        local.get 16
        f64x2.sub
        v128.store align=8
        local.get 15
        local.get 15
        v128.load offset=16 align=8
        local.get 17
        f64x2.sub
        v128.store offset=16 align=8
        local.get 6
        local.get 14
        i32.add
        local.set 15
        local.get 15
        local.get 15
        v128.load align=8
        local.get 18
        f64x2.sub
        v128.store align=8
        local.get 15
        local.get 15
        v128.load offset=16 align=8
        local.get 19
        f64x2.sub
        v128.store offset=16 align=8
        local.get 0
        i32.const 32
        i32.add
        local.set 0
        local.get 6
        i32.const 32
        i32.add
        local.set 6
        local.get 2
        i32.const 1
        i32.sub
        local.set 2
        br 0 (;@2;)
      end
    end)
  (func (;4;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 13
    local.get 7
    i32.const 1
    i32.mul
    local.set 15
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 17
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 18
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 19
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 20
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 21
            local.get 9
            v128.load align=8
            local.set 22
            local.get 10
            v128.load align=8
            local.set 23
            local.get 17
            local.get 21
            local.get 23
            f64x2.mul
            f64x2.add
            local.set 17
            local.get 19
            local.get 22
            local.get 23
            f64x2.mul
            f64x2.add
            local.set 19
            local.get 10
            local.get 13
            i32.add
            v128.load align=8
            local.set 23
            local.get 18
            local.get 21
            local.get 23
            f64x2.mul
            f64x2.add
            local.set 18
            local.get 20
            local.get 22
            local.get 23
            f64x2.mul
            f64x2.add
            local.set 20
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 16
        local.get 16
        local.get 16
        f64.load
        local.get 17
        f64x2.extract_lane 0
        local.get 17
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 16
        local.get 16
        f64.load offset=8
        local.get 19
        f64x2.extract_lane 0
        local.get 19
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 6
        local.get 15
        i32.add
        local.set 16
        local.get 16
        local.get 16
        f64.load
        local.get 18
        f64x2.extract_lane 0
        local.get 18
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 16
        local.get 16
        f64.load offset=8
        local.get 20
        f64x2.extract_lane 0
        local.get 20
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 16
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;5;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 13
    local.get 7
    i32.const 1
    i32.mul
    local.set 15
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 17
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 18
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 19
            local.get 10
            v128.load align=8
            local.set 21
            local.get 17
            local.get 19
            local.get 21
            f64x2.mul
            f64x2.add
            local.set 17
            local.get 10
            local.get 13
            i32.add
            v128.load align=8
            local.set 21
            local.get 18
            local.get 19
            local.get 21
            f64x2.mul
            f64x2.add
            local.set 18
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 16
        local.get 16
        local.get 16
        f64.load
        local.get 17
        f64x2.extract_lane 0
        local.get 17
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 6
        local.get 15
        i32.add
        local.set 16
        local.get 16
        local.get 16
        f64.load
        local.get 18
        f64x2.extract_lane 0
        local.get 18
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 8
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;6;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 12
    local.get 7
    i32.const 1
    i32.mul
    local.set 15
    local.get 5
    i32.const 2
    i32.mul
    local.set 13
    local.get 7
    i32.const 2
    i32.mul
    local.set 16
    block  ;; label = @1
      loop  ;; label = @2
        local.get 2
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 18
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 19
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 20
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 21
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 22
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 23
        local.get 0
        local.set 8
        local.get 4
        local.set 9
        local.get 3
        local.set 10
        block  ;; label = @3
          loop  ;; label = @4
            local.get 10
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 24
            local.get 8
            v128.load offset=16 align=8
            local.set 25
            local.get 9
            v128.load64_splat
            local.set 26
            local.get 18
            local.get 24
            local.get 26
            f64x2.mul
            f64x2.add
            local.set 18
            local.get 19
            local.get 25
            local.get 26
            f64x2.mul
            f64x2.add
            local.set 19
            local.get 9
            local.get 12
            i32.add
            v128.load64_splat
            local.set 26
            local.get 20
            local.get 24
            local.get 26
            f64x2.mul
            f64x2.add
            local.set 20
            local.get 21
            local.get 25
            local.get 26
            f64x2.mul
            f64x2.add
            local.set 21
            local.get 9
            local.get 13
            i32.add
            v128.load64_splat
            local.set 26
            local.get 22
            local.get 24
            local.get 26
            f64x2.mul
            f64x2.add
            local.set 22
            local.get 23
            local.get 25
            local.get 26
            f64x2.mul
            f64x2.add
            local.set 23
            local.get 8
            local.get 1
            i32.add
            local.set 8
            local.get 9
            i32.const 8
            i32.add
            local.set 9
            local.get 10
            i32.const 1
            i32.sub
            local.set 10
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 17
        local.get 17
        local.get 17
        v128.load align=8
        local.get 18
        f64x2.sub
        v128.store align=8
        local.get 17
        local.get 17
        v128.load offset=16 align=8
        local.get 19
        f64x2.sub
        v128.store offset=16 align=8
        local.get 6
        local.get 15
        i32.add
        local.set 17
        local.get 17
        local.get 17
        v128.load align=8
        local.get 20
        f64x2.sub
        v128.store align=8
        local.get 17
        local.get 17
        v128.load offset=16 align=8
        local.get 21
        f64x2.sub
        v128.store offset=16 align=8
        local.get 6
        local.get 16
        i32.add
        local.set 17
        local.get 17
        local.get 17
        v128.load align=8
        local.get 22
        f64x2.sub
        v128.store align=8
        local.get 17
        local.get 17
        v128.load offset=16 align=8
        local.get 23
        f64x2.sub
        v128.store offset=16 align=8
        local.get 0
        i32.const 32
        i32.add
        local.set 0
        local.get 6
        i32.const 32
        i32.add
        local.set 6
        local.get 2
        i32.const 1
        i32.sub
        local.set 2
        br 0 (;@2;)
      end
    end)
  (func (;7;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 13
    local.get 7
    i32.const 1
    i32.mul
    local.set 16
    local.get 5
    i32.const 2
    i32.mul
    local.set 14
    local.get 7
    i32.const 2
    i32.mul
    local.set 17
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 19
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 20
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 21
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 22
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 23
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 24
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 25
            local.get 9
            v128.load align=8
            local.set 26
            local.get 10
            v128.load align=8
            local.set 27
            local.get 19
            local.get 25
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 19
            local.get 22
            local.get 26
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 22
            local.get 10
            local.get 13
            i32.add
            v128.load align=8
            local.set 27
            local.get 20
            local.get 25
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 20
            local.get 23
            local.get 26
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 23
            local.get 10
            local.get 14
            i32.add
            v128.load align=8
            local.set 27
            local.get 21
            local.get 25
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 21
            local.get 24
            local.get 26
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 24
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 18
        local.get 18
        local.get 18
        f64.load
        local.get 19
        f64x2.extract_lane 0
        local.get 19
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 18
        local.get 18
        f64.load offset=8
        local.get 22
        f64x2.extract_lane 0
        local.get 22
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 6
        local.get 16
        i32.add
        local.set 18
        local.get 18
        local.get 18
        f64.load
        local.get 20
        f64x2.extract_lane 0
        local.get 20
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 18
        local.get 18
        f64.load offset=8
        local.get 23
        f64x2.extract_lane 0
        local.get 23
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 6
        local.get 17
        i32.add
        local.set 18
        local.get 18
        local.get 18
        f64.load
        local.get 21
        f64x2.extract_lane 0
        local.get 21
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 18
        local.get 18
        f64.load offset=8
        local.get 24
        f64x2.extract_lane 0
        local.get 24
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 16
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;8;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 13
    local.get 7
    i32.const 1
    i32.mul
    local.set 16
    local.get 5
    i32.const 2
    i32.mul
    local.set 14
    local.get 7
    i32.const 2
    i32.mul
    local.set 17
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 19
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 20
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 21
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 22
            local.get 10
            v128.load align=8
            local.set 24
            local.get 19
            local.get 22
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 19
            local.get 10
            local.get 13
            i32.add
            v128.load align=8
            local.set 24
            local.get 20
            local.get 22
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 20
            local.get 10
            local.get 14
            i32.add
            v128.load align=8
            local.set 24
            local.get 21
            local.get 22
            local.get 24
            f64x2.mul
            f64x2.add
            local.set 21
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 18
        local.get 18
        local.get 18
        f64.load
        local.get 19
        f64x2.extract_lane 0
        local.get 19
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 6
        local.get 16
        i32.add
        local.set 18
        local.get 18
        local.get 18
        f64.load
        local.get 20
        f64x2.extract_lane 0
        local.get 20
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 6
        local.get 17
        i32.add
        local.set 18
        local.get 18
        local.get 18
        f64.load
        local.get 21
        f64x2.extract_lane 0
        local.get 21
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 8
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;9;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 12
    local.get 7
    i32.const 1
    i32.mul
    local.set 16
    local.get 5
    i32.const 2
    i32.mul
    local.set 13
    local.get 7
    i32.const 2
    i32.mul
    local.set 17
    local.get 5
    i32.const 3
    i32.mul
    local.set 14
    local.get 7
    i32.const 3
    i32.mul
    local.set 18
    block  ;; label = @1
      loop  ;; label = @2
        local.get 2
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 20
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 21
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 22
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 23
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 24
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 25
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 26
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 27
        local.get 0
        local.set 8
        local.get 4
        local.set 9
        local.get 3
        local.set 10
        block  ;; label = @3
          loop  ;; label = @4
            local.get 10
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 28
            local.get 8
            v128.load offset=16 align=8
            local.set 29
            local.get 9
            v128.load64_splat
            local.set 30
            local.get 20
            local.get 28
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 20
            local.get 21
            local.get 29
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 21
            local.get 9
            local.get 12
            i32.add
            v128.load64_splat
            local.set 30
            local.get 22
            local.get 28
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 22
            local.get 23
            local.get 29
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 23
            local.get 9
            local.get 13
            i32.add
            v128.load64_splat
            local.set 30
            local.get 24
            local.get 28
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 24
            local.get 25
            local.get 29
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 25
            local.get 9
            local.get 14
            i32.add
            v128.load64_splat
            local.set 30
            local.get 26
            local.get 28
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 26
            local.get 27
            local.get 29
            local.get 30
            f64x2.mul
            f64x2.add
            local.set 27
            local.get 8
            local.get 1
            i32.add
            local.set 8
            local.get 9
            i32.const 8
            i32.add
            local.set 9
            local.get 10
            i32.const 1
            i32.sub
            local.set 10
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 19
        local.get 19
        local.get 19
        v128.load align=8
        local.get 20
        f64x2.sub
        v128.store align=8
        local.get 19
        local.get 19
        v128.load offset=16 align=8
        local.get 21
        f64x2.sub
        v128.store offset=16 align=8
        local.get 6
        local.get 16
        i32.add
        local.set 19
        local.get 19
        local.get 19
        v128.load align=8
        local.get 22
        f64x2.sub
        v128.store align=8
        local.get 19
        local.get 19
        v128.load offset=16 align=8
        local.get 23
        f64x2.sub
        v128.store offset=16 align=8
        local.get 6
        local.get 17
        i32.add
        local.set 19
        local.get 19
        local.get 19
        v128.load align=8
        local.get 24
        f64x2.sub
        v128.store align=8
        local.get 19
        local.get 19
        v128.load offset=16 align=8
        local.get 25
        f64x2.sub
        v128.store offset=16 align=8
        local.get 6
        local.get 18
        i32.add
        local.set 19
        local.get 19
        local.get 19
        v128.load align=8
        local.get 26
        f64x2.sub
        v128.store align=8
        local.get 19
        local.get 19
        v128.load offset=16 align=8
        local.get 27
        f64x2.sub
        v128.store offset=16 align=8
        local.get 0
        i32.const 32
        i32.add
        local.set 0
        local.get 6
        i32.const 32
        i32.add
        local.set 6
        local.get 2
        i32.const 1
        i32.sub
        local.set 2
        br 0 (;@2;)
      end
    end)
  (func (;10;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 13
    local.get 7
    i32.const 1
    i32.mul
    local.set 17
    local.get 5
    i32.const 2
    i32.mul
    local.set 14
    local.get 7
    i32.const 2
    i32.mul
    local.set 18
    local.get 5
    i32.const 3
    i32.mul
    local.set 15
    local.get 7
    i32.const 3
    i32.mul
    local.set 19
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 21
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 22
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 23
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 24
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 25
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 26
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 27
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 28
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 29
            local.get 9
            v128.load align=8
            local.set 30
            local.get 10
            v128.load align=8
            local.set 31
            local.get 21
            local.get 29
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 21
            local.get 25
            local.get 30
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 25
            local.get 10
            local.get 13
            i32.add
            v128.load align=8
            local.set 31
            local.get 22
            local.get 29
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 22
            local.get 26
            local.get 30
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 26
            local.get 10
            local.get 14
            i32.add
            v128.load align=8
            local.set 31
            local.get 23
            local.get 29
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 23
            local.get 27
            local.get 30
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 27
            local.get 10
            local.get 15
            i32.add
            v128.load align=8
            local.set 31
            local.get 24
            local.get 29
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 24
            local.get 28
            local.get 30
            local.get 31
            f64x2.mul
            f64x2.add
            local.set 28
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 21
        f64x2.extract_lane 0
        local.get 21
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 20
        local.get 20
        f64.load offset=8
        local.get 25
        f64x2.extract_lane 0
        local.get 25
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 6
        local.get 17
        i32.add
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 22
        f64x2.extract_lane 0
        local.get 22
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 20
        local.get 20
        f64.load offset=8
        local.get 26
        f64x2.extract_lane 0
        local.get 26
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 6
        local.get 18
        i32.add
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 23
        f64x2.extract_lane 0
        local.get 23
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 20
        local.get 20
        f64.load offset=8
        local.get 27
        f64x2.extract_lane 0
        local.get 27
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 6
        local.get 19
        i32.add
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 24
        f64x2.extract_lane 0
        local.get 24
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 20
        local.get 20
        f64.load offset=8
        local.get 28
        f64x2.extract_lane 0
        local.get 28
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store offset=8
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 16
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;11;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 i32 v128 v128 v128 v128 v128 v128 v128)
    local.get 5
    i32.const 1
    i32.mul
    local.set 13
    local.get 7
    i32.const 1
    i32.mul
    local.set 17
    local.get 5
    i32.const 2
    i32.mul
    local.set 14
    local.get 7
    i32.const 2
    i32.mul
    local.set 18
    local.get 5
    i32.const 3
    i32.mul
    local.set 15
    local.get 7
    i32.const 3
    i32.mul
    local.set 19
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 21
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 22
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 23
        v128.const i32x4 0x00000000 0x00000000 0x00000000 0x00000000
        local.set 24
        local.get 0
        local.set 8
        local.get 0
        local.get 1
        i32.add
        local.set 9
        local.get 4
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            local.get 8
            v128.load align=8
            local.set 25
            local.get 10
            v128.load align=8
            local.set 27
            local.get 21
            local.get 25
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 21
            local.get 10
            local.get 13
            i32.add
            v128.load align=8
            local.set 27
            local.get 22
            local.get 25
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 22
            local.get 10
            local.get 14
            i32.add
            v128.load align=8
            local.set 27
            local.get 23
            local.get 25
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 23
            local.get 10
            local.get 15
            i32.add
            v128.load align=8
            local.set 27
            local.get 24
            local.get 25
            local.get 27
            f64x2.mul
            f64x2.add
            local.set 24
            local.get 8
            i32.const 16
            i32.add
            local.set 8
            local.get 9
            i32.const 16
            i32.add
            local.set 9
            local.get 10
            i32.const 16
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 6
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 21
        f64x2.extract_lane 0
        local.get 21
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 6
        local.get 17
        i32.add
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 22
        f64x2.extract_lane 0
        local.get 22
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 6
        local.get 18
        i32.add
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 23
        f64x2.extract_lane 0
        local.get 23
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 6
        local.get 19
        i32.add
        local.set 20
        local.get 20
        local.get 20
        f64.load
        local.get 24
        f64x2.extract_lane 0
        local.get 24
        f64x2.extract_lane 1
        f64.add
        f64.sub
        f64.store
        local.get 0
        local.get 1
        i32.add
        local.set 0
        local.get 6
        i32.const 8
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;12;) (type 1) (param i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 f64)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        local.get 0
        local.set 6
        local.get 4
        local.set 7
        local.get 2
        local.set 8
        block  ;; label = @3
          loop  ;; label = @4
            local.get 8
            i32.eqz
            br_if 1 (;@3;)
            local.get 7
            f64.load
            local.set 12
            local.get 8
            i32.const 1
            i32.sub
            local.set 9
            local.get 6
            local.set 10
            local.get 7
            local.set 11
            block  ;; label = @5
              loop  ;; label = @6
                local.get 9
                i32.eqz
                br_if 1 (;@5;)
                local.get 10
                i32.const 8
                i32.add
                local.set 10
                local.get 11
                i32.const 8
                i32.add
                local.set 11
                local.get 11
                local.get 11
                f64.load
                local.get 10
                f64.load
                local.get 12
                f64.mul
                f64.sub
                f64.store
                local.get 9
                i32.const 1
                i32.sub
                local.set 9
                br 0 (;@6;)
              end
            end
            local.get 6
            local.get 1
            i32.const 8
            i32.add
            i32.add
            local.set 6
            local.get 7
            i32.const 8
            i32.add
            local.set 7
            local.get 8
            i32.const 1
            i32.sub
            local.set 8
            br 0 (;@4;)
          end
        end
        local.get 4
        local.get 5
        i32.add
        local.set 4
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;13;) (type 1) (param i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 f64)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        local.get 0
        local.get 2
        i32.const 1
        i32.sub
        local.get 1
        i32.const 8
        i32.add
        i32.mul
        i32.add
        local.set 6
        local.get 4
        local.get 2
        i32.const 1
        i32.sub
        i32.const 8
        i32.mul
        i32.add
        local.set 7
        local.get 2
        local.set 8
        block  ;; label = @3
          loop  ;; label = @4
            local.get 8
            i32.eqz
            br_if 1 (;@3;)
            f64.const 0x0p+0 (;=0;)
            local.set 12
            local.get 2
            local.get 8
            i32.sub
            local.set 9
            local.get 6
            local.set 10
            local.get 7
            local.set 11
            block  ;; label = @5
              loop  ;; label = @6
                local.get 9
                i32.eqz
                br_if 1 (;@5;)
                local.get 10
                i32.const 8
                i32.add
                local.set 10
                local.get 11
                i32.const 8
                i32.add
                local.set 11
                local.get 12
                local.get 10
                f64.load
                local.get 11
                f64.load
                f64.mul
                f64.add
                local.set 12
                local.get 9
                i32.const 1
                i32.sub
                local.set 9
                br 0 (;@6;)
              end
            end
            local.get 7
            local.get 7
            f64.load
            local.get 12
            f64.sub
            f64.store
            local.get 6
            local.get 1
            i32.const 8
            i32.add
            i32.sub
            local.set 6
            local.get 7
            i32.const 8
            i32.sub
            local.set 7
            local.get 8
            i32.const 1
            i32.sub
            local.set 8
            br 0 (;@4;)
          end
        end
        local.get 4
        local.get 5
        i32.add
        local.set 4
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (func (;14;) (type 2) (param i32 i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 i32 i32 i32 f64)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 8
        i32.eqz
        br_if 1 (;@1;)
        local.get 0
        local.set 9
        local.get 6
        local.set 10
        local.get 2
        local.set 11
        block  ;; label = @3
          loop  ;; label = @4
            local.get 11
            i32.eqz
            br_if 1 (;@3;)
            f64.const 0x0p+0 (;=0;)
            local.set 15
            local.get 9
            local.set 13
            local.get 4
            local.set 14
            local.get 3
            local.set 12
            block  ;; label = @5
              loop  ;; label = @6
                local.get 12
                i32.eqz
                br_if 1 (;@5;)
                local.get 15
                local.get 13
                f64.load
                local.get 14
                f64.load
                f64.mul
                f64.add
                local.set 15
                local.get 13
                local.get 1
                i32.add
                local.set 13
                local.get 14
                i32.const 8
                i32.add
                local.set 14
                local.get 12
                i32.const 1
                i32.sub
                local.set 12
                br 0 (;@6;)
              end
            end
            local.get 10
            local.get 10
            f64.load
            local.get 15
            f64.sub
            f64.store
            local.get 9
            i32.const 8
            i32.add
            local.set 9
            local.get 10
            i32.const 8
            i32.add
            local.set 10
            local.get 11
            i32.const 1
            i32.sub
            local.set 11
            br 0 (;@4;)
          end
        end
        local.get 4
        local.get 5
        i32.add
        local.set 4
        local.get 6
        local.get 7
        i32.add
        local.set 6
        local.get 8
        i32.const 1
        i32.sub
        local.set 8
        br 0 (;@2;)
      end
    end)
  (func (;15;) (type 0) (param i32 i32 i32 i32 i32 i32 i32 i32)
    (local i32 i32 i32 f64)
    block  ;; label = @1
      loop  ;; label = @2
        local.get 3
        i32.eqz
        br_if 1 (;@1;)
        local.get 4
        f64.load
        local.set 11
        local.get 0
        local.set 8
        local.get 6
        local.set 9
        local.get 2
        local.set 10
        block  ;; label = @3
          loop  ;; label = @4
            local.get 10
            i32.eqz
            br_if 1 (;@3;)
            local.get 9
            local.get 9
            f64.load
            local.get 8
            f64.load
            local.get 11
            f64.mul
            f64.sub
            f64.store
            local.get 8
            local.get 1
            i32.add
            local.set 8
            local.get 9
            i32.const 8
            i32.add
            local.set 9
            local.get 10
            i32.const 1
            i32.sub
            local.set 10
            br 0 (;@4;)
          end
        end
        local.get 4
        local.get 5
        i32.add
        local.set 4
        local.get 6
        local.get 7
        i32.add
        local.set 6
        local.get 3
        i32.const 1
        i32.sub
        local.set 3
        br 0 (;@2;)
      end
    end)
  (export "c1" (func 0))
  (export "d1" (func 1))
  (export "e1" (func 2))
  (export "c2" (func 3))
  (export "d2" (func 4))
  (export "e2" (func 5))
  (export "c3" (func 6))
  (export "d3" (func 7))
  (export "e3" (func 8))
  (export "c4" (func 9))
  (export "d4" (func 10))
  (export "e4" (func 11))
  (export "tf" (func 12))
  (export "tb" (func 13))
  (export "ct" (func 14))
  (export "dt" (func 15)))
