/**
 * Run `fn` after the next paint: in the frame's animation callback a task is queued, and tasks queued there run after
 * that frame is painted. Used to let the browser show what just changed (a typed key, a panel) before work that
 * would keep the main thread busy in the same task (a table redrawn, a chart created).
 */
export function afterPaint(fn: () => void): void {
  requestAnimationFrame(() => setTimeout(fn, 0));
}
