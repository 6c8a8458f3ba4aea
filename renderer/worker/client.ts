/**
 * The UI side of the engine worker. Every call is a promise; a call that takes longer than ~300 ms shows the
 * progress indicator, and Cancel ends the worker at once (a long LU cannot be interrupted from inside) and
 * starts a fresh one, replaying the calls that set its state (the loaded table) so the app carries on.
 */
import { reactive, toRaw } from 'vue';
import type { RpcFailure, RpcRequest, RpcResponse } from './rpc.ts';
import type { EngineApi } from './protocol.ts';

export class EngineError extends Error {
  readonly refused: boolean;
  readonly code: string | undefined;
  constructor(f: RpcFailure) {
    super(f.message);
    this.name = 'EngineError';
    this.refused = f.refused;
    this.code = f.code;
  }
}

export class CancelledError extends Error {
  constructor() {
    super('cancelled');
    this.name = 'CancelledError';
  }
}

export const SLOW_MS = 300;

interface Pending {
  resolve: (v: unknown) => void;
  reject: (e: unknown) => void;
  /** null: background work (the recovery copy) that never shows the indicator. */
  label: string | null;
  started: number;
}

/** What the progress indicator shows. */
export const progress = reactive({ visible: false, label: '', running: 0 });

type Op = keyof EngineApi;
type Args<K extends Op> = Parameters<EngineApi[K]>[0];
type Result<K extends Op> = Awaited<ReturnType<EngineApi[K]>>;

/** Calls whose effect is the worker's state: replayed after a cancel. */
const STATEFUL: ReadonlySet<string> = new Set(['loadSample', 'loadTable', 'loadFile', 'openProject']);

export class EngineClient {
  private worker: Worker;
  private seq = 0;
  private pending = new Map<number, Pending>();
  private stateCall: RpcRequest | null = null;
  private timer: ReturnType<typeof setTimeout> | null = null;

  constructor(private readonly make: () => Worker) {
    this.worker = this.start();
  }

  private start(): Worker {
    const w = this.make();
    w.onmessage = (e: MessageEvent<RpcResponse>) => this.answer(e.data);
    w.onerror = (e) => {
      e.preventDefault();
      const f: RpcFailure = { message: `the computation stopped: ${e.message || 'worker error'}`, refused: false };
      for (const [id, p] of this.pending) {
        this.pending.delete(id);
        p.reject(new EngineError(f));
      }
      this.refresh();
    };
    return w;
  }

  /** `label` is what the indicator says if the call runs long; null for background work the user did not ask for. */
  call<K extends Op>(op: K, args: Args<K>, label: string | null = 'Computing…'): Promise<Result<K>> {
    const id = ++this.seq;
    const req: RpcRequest = { id, op, args: plain(args) };
    return new Promise<Result<K>>((resolve, reject) => {
      this.pending.set(id, { resolve: resolve as (v: unknown) => void, reject, label, started: Date.now() });
      this.worker.postMessage(req);
      this.refresh();
    }).then((v) => {
      if (STATEFUL.has(op)) this.stateCall = req;
      return v;
    });
  }

  /** Stop whatever is running; pending calls reject with CancelledError. */
  cancel(): void {
    this.worker.terminate();
    for (const [id, p] of this.pending) {
      this.pending.delete(id);
      p.reject(new CancelledError());
    }
    this.worker = this.start();
    if (this.stateCall) {
      const replay: RpcRequest = { ...this.stateCall, id: ++this.seq };
      this.worker.postMessage(replay);
    }
    this.refresh();
  }

  private answer(r: RpcResponse): void {
    const p = this.pending.get(r.id);
    if (!p) return;
    this.pending.delete(r.id);
    if (r.ok) p.resolve(r.value);
    else p.reject(new EngineError(r.error));
    this.refresh();
  }

  /** Show the indicator only once the oldest running call has passed SLOW_MS. */
  private refresh(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    const shown = [...this.pending.values()].filter((p) => p.label !== null);
    progress.running = shown.length;
    if (shown.length === 0) {
      progress.visible = false;
      return;
    }
    const oldest = shown.reduce((a, b) => (a.started <= b.started ? a : b));
    progress.label = oldest.label!;
    const wait = SLOW_MS - (Date.now() - oldest.started);
    if (wait <= 0) progress.visible = true;
    else this.timer = setTimeout(() => this.refresh(), wait);
  }
}

/** Vue proxies cannot be posted to a worker: unwrap them (deeply) first. */
export function plain<T>(v: T): T {
  const raw = toRaw(v) as unknown;
  if (Array.isArray(raw)) return raw.map((x) => plain(x)) as T;
  if (raw && typeof raw === 'object' && Object.getPrototypeOf(raw) === Object.prototype) {
    const out: Record<string, unknown> = {};
    for (const [k, x] of Object.entries(raw)) out[k] = plain(x);
    return out as T;
  }
  return raw as T;
}

let client: EngineClient | null = null;

export function engine(): EngineClient {
  client ??= new EngineClient(() => new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module', name: 'roundwise-engine' }));
  return client;
}
