/**
 * The message shape between the UI thread and the engine worker: one request, one answer, matched by id.
 * A refused input travels as a located message (never a stack trace); anything else as a short internal error.
 */
export interface RpcRequest {
  id: number;
  op: string;
  args: unknown;
}

export interface RpcFailure {
  /** One line for the user, with the location ("county.csv:12:4 (row 'Farming'): …"). */
  message: string;
  /** True for refused input (InputError); false for an internal failure. */
  refused: boolean;
  code?: string;
}

export type RpcResponse =
  | { id: number; ok: true; value: unknown }
  | { id: number; ok: false; error: RpcFailure };
