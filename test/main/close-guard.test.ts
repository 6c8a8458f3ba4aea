// Unsaved-changes prompt on close (common practice, no source: the usual Save / Don't save / Cancel choice).
import { describe, it, expect } from 'vitest';
import { CLOSE_PROMPT, closeAction } from '../../main/close-guard.ts';

describe('closeAction', () => {
  it('closes a clean project without asking', () => {
    expect(closeAction(false)).toBe('close');
  });
  it('asks first when there are unsaved changes, then follows the button', () => {
    expect(closeAction(true)).toBe('ask');
    expect(closeAction(true, 0)).toBe('save-first');
    expect(closeAction(true, 1)).toBe('discard-and-close');
    expect(closeAction(true, CLOSE_PROMPT.cancelId)).toBe('stay');
    expect(closeAction(true, 7)).toBe('stay');
  });
  it('has Cancel as the escape button and Save as the default', () => {
    expect(CLOSE_PROMPT.buttons[CLOSE_PROMPT.cancelId]).toBe('Cancel');
    expect(CLOSE_PROMPT.buttons[CLOSE_PROMPT.defaultId]).toMatch(/^Save/);
  });
});
