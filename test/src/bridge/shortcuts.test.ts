// Shortcut table shared by the desktop menu and the browser bridge. Reference: the platform conventions for
// Open/Save/Save As/Undo/Redo (Cmd on macOS, Ctrl elsewhere; Ctrl+Y as an extra redo on Windows/Linux) —
// common practice, no source.
import { describe, it, expect } from 'vitest';
import { SHORTCUTS, acceleratorFor, commandForKey, isTextEditing, type KeyChord } from '../../../src/bridge/shortcuts.ts';

const chord = (key: string, mods: Partial<KeyChord> = {}): KeyChord =>
  ({ key, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods });

describe('menu shortcuts', () => {
  it('maps Ctrl chords on Windows/Linux', () => {
    expect(commandForKey(chord('o', { ctrlKey: true }), false)).toBe('open-table');
    expect(commandForKey(chord('s', { ctrlKey: true }), false)).toBe('save-project');
    expect(commandForKey(chord('S', { ctrlKey: true, shiftKey: true }), false)).toBe('save-project-as');
    expect(commandForKey(chord('z', { ctrlKey: true }), false)).toBe('undo');
    expect(commandForKey(chord('Z', { ctrlKey: true, shiftKey: true }), false)).toBe('redo');
    expect(commandForKey(chord('y', { ctrlKey: true }), false)).toBe('redo');
  });
  it('maps Cmd chords on macOS and ignores Ctrl there', () => {
    expect(commandForKey(chord('o', { metaKey: true }), true)).toBe('open-table');
    expect(commandForKey(chord('z', { metaKey: true, shiftKey: true }), true)).toBe('redo');
    expect(commandForKey(chord('o', { ctrlKey: true }), true)).toBeNull();
    expect(commandForKey(chord('y', { metaKey: true }), true)).toBeNull();
  });
  it('ignores plain keys, Alt chords and unknown letters', () => {
    expect(commandForKey(chord('o'), false)).toBeNull();
    expect(commandForKey(chord('o', { ctrlKey: true, altKey: true }), false)).toBeNull();
    expect(commandForKey(chord('q', { ctrlKey: true }), false)).toBeNull();
  });
  it('has one accelerator per command and no two commands on the same chord', () => {
    const chords = SHORTCUTS.map((s) => `${s.key}/${s.shift}`);
    expect(new Set(chords).size).toBe(chords.length);
    expect(acceleratorFor('save-project-as')).toBe('CmdOrCtrl+Shift+S');
    expect(acceleratorFor('about')).toBeUndefined();
  });
  it('leaves undo inside text fields to the field', () => {
    expect(isTextEditing({ tagName: 'INPUT', type: 'text' })).toBe(true);
    expect(isTextEditing({ tagName: 'input', type: 'number' })).toBe(true);
    expect(isTextEditing({ tagName: 'TEXTAREA' })).toBe(true);
    expect(isTextEditing({ tagName: 'DIV', isContentEditable: true })).toBe(true);
    expect(isTextEditing({ tagName: 'INPUT', type: 'checkbox' })).toBe(false);
    expect(isTextEditing({ tagName: 'BUTTON' })).toBe(false);
    expect(isTextEditing(null)).toBe(false);
  });
});
