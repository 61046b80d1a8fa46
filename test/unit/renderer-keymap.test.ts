import { describe, expect, it } from 'vitest';
import { ACTION_IDS, actionFor, KEYMAP, keyName } from '../../renderer/ui/keymap.js';

const press = (key: string, shiftKey = false) => ({ key, shiftKey, ctrlKey: false, altKey: false, metaKey: false });

describe('keymap', () => {
  it('binds no key twice', () => {
    const keys = KEYMAP.flatMap((b) => b.keys);
    expect(keys.length).toBe(new Set(keys).size);
  });
  it('gives every action a key, and lists each action once', () => {
    const actions = KEYMAP.map((b) => b.action);
    expect(new Set(actions).size).toBe(actions.length);
    expect([...actions].sort()).toEqual([...ACTION_IDS].sort());
    for (const b of KEYMAP) expect(b.keys.length).toBeGreaterThan(0);
  });
  it('reads Shift with letters but not with symbols typed with Shift', () => {
    expect(keyName(press('N', true))).toBe('Shift+N');
    expect(keyName(press('n'))).toBe('n');
    expect(actionFor(press('N', true))).toBe('next-pending');
    expect(actionFor(press('>', true))).toBe('nudge-up-large');
    expect(actionFor(press('?', true))).toBe('help');
  });
  it('leaves Ctrl/Alt/Meta combinations to the system', () => {
    expect(actionFor({ ...press('a'), ctrlKey: true })).toBeNull();
  });
});
