/**
 * Compiling and instantiating the hand-assembled WebAssembly modules (wasm-bytes.ts), over
 * shared memories. The project's lib settings (ES2022, Node types) do not describe the
 * `WebAssembly` global, so the few names used are declared here, once, for every module.
 */

declare const WebAssembly: {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: Record<string, Record<string, unknown>>) => { exports: Record<string, unknown> };
  Memory: new (descriptor: { initial: number; maximum: number; shared: boolean }) => WasmMemory;
};

/** A WebAssembly memory (shared: its buffer is a SharedArrayBuffer where the runtime has them). */
export interface WasmMemory {
  buffer: ArrayBuffer | SharedArrayBuffer;
}

/** Bytes per page of a WebAssembly memory. */
export const PAGE_BYTES = 65536;
/** Most pages of a 32-bit memory (4 GiB). */
export const MAX_PAGES = 65536;

/**
 * The compiled module of `bytes`, compiled on first use and kept; null where WebAssembly, or a
 * feature the bytes use (SIMD, shared memory), is missing.
 */
export function compileOnce(bytes: () => Uint8Array): () => object | null {
  let compiled: object | null | undefined;
  return () => {
    if (compiled === undefined) {
      try {
        compiled = new WebAssembly.Module(bytes());
      } catch {
        compiled = null;
      }
    }
    return compiled;
  };
}

/**
 * A kernel module that tests and benchmarks can switch off (the plain loops then run): `compiled`
 * as compileOnce, `inUse` when switched on and compiled, `use(on)` switches it for what is made
 * from now on and returns whether the kernels are in use.
 */
export interface SwitchableModule {
  compiled: () => object | null;
  inUse: () => boolean;
  use: (on: boolean) => boolean;
}

export function switchableModule(bytes: () => Uint8Array): SwitchableModule {
  const compiled = compileOnce(bytes);
  let enabled = true;
  const inUse = () => enabled && compiled() !== null;
  return {
    compiled,
    inUse,
    use: (on) => {
      enabled = on;
      return inUse();
    },
  };
}

/** The exports of an instance of `module` over `memory` (imported as k.memory); throws where it cannot be made. */
export function instantiate(module: object, memory: WasmMemory): Record<string, unknown> {
  return new WebAssembly.Instance(module, { k: { memory } }).exports;
}

/** A shared memory of exactly `pages` pages; throws where shared memories are unavailable. */
export function sharedMemory(pages: number): WasmMemory {
  return new WebAssembly.Memory({ initial: pages, maximum: pages, shared: true });
}
