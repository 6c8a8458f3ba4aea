/**
 * The unsaved-changes prompt when the window closes. The decision is pure; main/index.ts shows the dialog.
 */
export const CLOSE_PROMPT = {
  message: 'Save changes to this project before closing?',
  detail: 'Your changes will be lost if you close without saving.',
  buttons: ['Save…', 'Close without saving', 'Cancel'],
  defaultId: 0,
  cancelId: 2,
} as const;

export type CloseAction = 'close' | 'ask' | 'save-first' | 'discard-and-close' | 'stay';

/** `choice` is the index of the button the user picked in CLOSE_PROMPT; undefined before asking. */
export function closeAction(dirty: boolean, choice?: number): CloseAction {
  if (!dirty) return 'close';
  if (choice === undefined) return 'ask';
  if (choice === 0) return 'save-first';
  if (choice === 1) return 'discard-and-close';
  return 'stay';
}
