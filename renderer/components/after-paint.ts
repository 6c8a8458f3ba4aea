import { onMounted, ref, type Ref } from 'vue';

/**
 * Run `fn` after the next paint: in the frame's animation callback a task is queued, and tasks queued there run after
 * that frame is painted. Used to let the browser show what just changed (a typed key, a panel) before work that
 * would keep the main thread busy in the same task (a table redrawn, a chart created).
 */
export function afterPaint(fn: () => void): void {
  requestAnimationFrame(() => setTimeout(fn, 0));
}

/**
 * A flag that turns true after the `paints`-th paint following the calling component's mount: the parts of a large
 * screen shown behind it are mounted in a task of their own, so the screen's first render is several short tasks
 * instead of one long one.
 */
export function shownAfterPaint(paints = 1): Ref<boolean> {
  const shown = ref(false);
  const wait = (left: number): void => afterPaint(() => { if (left > 1) wait(left - 1); else shown.value = true; });
  onMounted(() => wait(paints));
  return shown;
}
