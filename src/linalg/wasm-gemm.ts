/**
 * The C −= A·B micro-kernel as a tiny WebAssembly module with 128-bit SIMD, assembled here byte by byte (no toolchain,
 * no binary blob to trust): a 4×4 block of C is held in eight f64x2 registers for the whole depth k, so each step of
 * k costs two vector loads of B, four splat loads of A and sixteen vector multiply/adds, and C is read and written
 * once. V8 compiles it to SSE/AVX instructions; on a CPU or engine without Wasm SIMD the module fails to compile and
 * the JavaScript kernel (gemm.ts) is used instead.
 *
 * Encoding reference: the WebAssembly Core Specification 2.0 (binary format, §5) and its fixed-width SIMD opcodes.
 */

/** The minimal slice of the WebAssembly JS API used here (src/ is type-checked without DOM or Node typings). */
export interface WasmMemory { readonly buffer: ArrayBuffer | SharedArrayBuffer; grow(pages: number): number }
interface WasmApi {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: Record<string, Record<string, unknown>>) => { exports: Record<string, unknown> };
  Memory: new (descriptor: { initial: number; maximum?: number; shared?: boolean }) => WasmMemory;
}

/** gemm(c, ldcBytes, a, ldaBytes, b, ldbBytes, m, n, k): C −= A·B for m and n multiples of 4 and k ≥ 1; byte addresses. */
export type WasmGemm = (c: number, ldc: number, a: number, lda: number, b: number, ldb: number, m: number, n: number, k: number) => void;

// ---- binary encoding helpers ----
function uleb(v: number): number[] {
  const out: number[] = [];
  do {
    let byte = v & 0x7f;
    v >>>= 7;
    if (v !== 0) byte |= 0x80;
    out.push(byte);
  } while (v !== 0);
  return out;
}
function sleb(v: number): number[] {
  const out: number[] = [];
  for (;;) {
    const byte = v & 0x7f;
    v >>= 7;
    if ((v === 0 && (byte & 0x40) === 0) || (v === -1 && (byte & 0x40) !== 0)) { out.push(byte); return out; }
    out.push(byte | 0x80);
  }
}
function vec(items: number[][]): number[] { return [...uleb(items.length), ...items.flat()]; }
function section(id: number, body: number[]): number[] { return [id, ...uleb(body.length), ...body]; }
function name(s: string): number[] { return vec([...s].map((ch) => [ch.charCodeAt(0)])); }

const I32 = 0x7f;
const V128 = 0x7b;
const op = {
  block: 0x02, loop: 0x03, end: 0x0b, br: 0x0c, brIf: 0x0d,
  get: 0x20, set: 0x21, tee: 0x22,
  i32const: 0x41, i32eqz: 0x45, i32geU: 0x4f, i32add: 0x6a, i32sub: 0x6b, i32mul: 0x6c, i32shl: 0x74,
};
const simd = (code: number): number[] => [0xfd, ...uleb(code)];
const memarg = (offset: number): number[] => [3, ...uleb(offset)]; // alignment hint 2³ = 8 bytes: f64 data
const v128load = (offset: number): number[] => [...simd(0x00), ...memarg(offset)];
const v128load64splat = (offset: number): number[] => [...simd(0x0a), ...memarg(offset)];
const v128store = (offset: number): number[] => [...simd(0x0b), ...memarg(offset)];
const v128zero = (): number[] => [...simd(0x0c), ...new Array<number>(16).fill(0)];
const f64x2add = simd(240);
const f64x2sub = simd(241);
const f64x2mul = simd(242);

/** The gemm function body (see WasmGemm). */
function gemmBody(): number[] {
  // parameters
  const C = 0, LDC = 1, A = 2, LDA = 3, B = 4, LDB = 5, M = 6, N = 7, K = 8;
  // i32 locals
  const I = 9, J = 10, P = 11, PA = 12, PB = 13, AROW = 14, CROW = 15, PC = 16, LDA2 = 17, LDA3 = 18;
  // v128 locals
  const ACC = 19; // 19..26: acc[r][h] at ACC + 2r + h
  const B0 = 27, B1 = 28, X = 29;
  const locals = [[...uleb(10), I32], [...uleb(11), V128]];
  const g = (l: number): number[] => [op.get, ...uleb(l)];
  const s = (l: number): number[] => [op.set, ...uleb(l)];
  const code: number[] = [];
  const emit = (...parts: number[][]): void => { for (const p of parts) code.push(...p); };

  emit(g(LDA), g(LDA), [op.i32add], s(LDA2));
  emit(g(LDA2), g(LDA), [op.i32add], s(LDA3));
  const microTile = (): void => {
    for (let q = 0; q < 8; q++) emit(v128zero(), s(ACC + q));
    emit(g(AROW), s(PA));
    emit(g(B), g(J), [op.i32const, 3], [op.i32shl], [op.i32add], s(PB));
    emit(g(K), s(P));
    emit([op.loop, 0x40]); // p loop (k ≥ 1)
    emit(g(PB), v128load(0), s(B0));
    emit(g(PB), v128load(16), s(B1));
    for (let r = 0; r < 4; r++) {
      if (r === 0) emit(g(PA));
      else emit(g(PA), g(r === 1 ? LDA : r === 2 ? LDA2 : LDA3), [op.i32add]);
      emit(v128load64splat(0), s(X));
      for (let h = 0; h < 2; h++) {
        const acc = ACC + 2 * r + h;
        emit(g(acc), g(X), g(h === 0 ? B0 : B1), f64x2mul, f64x2add, s(acc));
      }
    }
    emit(g(PA), [op.i32const, 8], [op.i32add], s(PA));
    emit(g(PB), g(LDB), [op.i32add], s(PB));
    emit(g(P), [op.i32const, 1], [op.i32sub], [op.tee, ...uleb(P)], [op.brIf, 0]);
    emit([op.end]); // p loop
    emit(g(CROW), g(J), [op.i32const, 3], [op.i32shl], [op.i32add], s(PC));
    for (let r = 0; r < 4; r++) {
      if (r > 0) emit(g(PC), g(LDC), [op.i32add], s(PC));
      for (let h = 0; h < 2; h++) {
        emit(g(PC), g(PC), v128load(16 * h), g(ACC + 2 * r + h), f64x2sub, v128store(16 * h));
      }
    }
  };
  // Rows of C outer, columns inner: the 4×k strip of A stays in L1 while B's tile streams from L2 (measured faster
  // than the other order in test/bench shapes).
  emit([op.i32const, ...sleb(0)], s(I));
  emit([op.block, 0x40], [op.loop, 0x40]); // outer i loop
  emit(g(I), g(M), [op.i32geU], [op.brIf, 1]);
  emit(g(A), g(I), g(LDA), [op.i32mul], [op.i32add], s(AROW));
  emit(g(C), g(I), g(LDC), [op.i32mul], [op.i32add], s(CROW));
  emit([op.i32const, 0], s(J));
  emit([op.block, 0x40], [op.loop, 0x40]); // j loop
  emit(g(J), g(N), [op.i32geU], [op.brIf, 1]);
  microTile();
  emit(g(J), [op.i32const, 4], [op.i32add], s(J));
  emit([op.br, 0], [op.end], [op.end]); // j loop
  emit(g(I), [op.i32const, 4], [op.i32add], s(I));
  emit([op.br, 0], [op.end], [op.end]); // i loop
  emit([op.end]); // function
  const body = [...vec(locals), ...code];
  return [...uleb(body.length), ...body];
}

/** Maximum size of the shared memory used with helper threads (a shared Wasm memory must declare one): 2 GiB. */
export const SHARED_MAX_PAGES = 32768;

/** The module: imports memory env.mem (shared, for helper threads, or not), exports gemm. */
export function gemmModuleBytes(shared = false): Uint8Array {
  const type = section(1, vec([[0x60, ...vec(new Array<number[]>(9).fill([I32])), ...vec([])]]));
  const limits = shared ? [0x03, ...uleb(1), ...uleb(SHARED_MAX_PAGES)] : [0x00, ...uleb(1)];
  const imports = section(2, vec([[...name('env'), ...name('mem'), 0x02, ...limits]]));
  const funcs = section(3, vec([uleb(0)]));
  const exports = section(7, vec([[...name('gemm'), 0x00, ...uleb(0)]]));
  const code = section(10, vec([gemmBody()]));
  return Uint8Array.from([0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00, ...type, ...imports, ...funcs, ...exports, ...code]);
}

export interface WasmKernel {
  memory: WasmMemory;
  gemm: WasmGemm;
  /** The compiled module, to instantiate the same kernel in helper threads over the same (shared) memory. */
  module: object;
}

const compiled: { plain?: object | null; shared?: object | null } = {};

function wasmApi(): WasmApi | undefined {
  return (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;
}

function compiledModule(api: WasmApi, shared: boolean): object | null {
  const key = shared ? 'shared' : 'plain';
  if (compiled[key] === undefined) {
    try { compiled[key] = new api.Module(gemmModuleBytes(shared)); } catch { compiled[key] = null; }
  }
  return compiled[key] ?? null;
}

/**
 * A fresh instance over its own memory of at least `bytes` bytes, or null without Wasm SIMD (or, when `shared`,
 * without shared memory: a browser page that is not cross-origin isolated).
 */
export function instantiateGemm(bytes: number, shared = false): WasmKernel | null {
  const api = wasmApi();
  if (!api) return null;
  const module = compiledModule(api, shared);
  if (module === null) return null;
  const pages = Math.max(1, Math.ceil(bytes / 65536));
  let memory: WasmMemory;
  try {
    memory = new api.Memory(shared ? { initial: pages, maximum: SHARED_MAX_PAGES, shared: true } : { initial: pages });
  } catch { return null; }
  const instance = new api.Instance(module, { env: { mem: memory } });
  return { memory, gemm: instance.exports['gemm'] as WasmGemm, module };
}
