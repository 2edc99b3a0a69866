import { describe, expect, it } from 'vitest';
import { noteRole } from '../../src/features/account/utils/last-role';

function memoryStorage() {
  const m = new Map<string, string>();
  return { getItem: (k: string) => m.get(k) ?? null, setItem: (k: string, v: string) => void m.set(k, v) };
}

describe('role change told at sign-in', () => {
  it('says nothing the first time and when the role is the same', () => {
    const storage = memoryStorage();
    expect(noteRole({ id: 'u1', role: 'technician' }, storage)).toBeNull();
    expect(noteRole({ id: 'u1', role: 'technician' }, storage)).toBeNull();
  });

  it('says which role a person had and has now after an administrator changed it', () => {
    const storage = memoryStorage();
    noteRole({ id: 'u1', role: 'technician' }, storage);
    const change = noteRole({ id: 'u1', role: 'engineer' }, storage);
    expect(change).toMatchObject({ from: 'technician', to: 'engineer' });
    expect(change!.text).toMatch(/changed your role from Technician to Fleet engineer/);
    expect(noteRole({ id: 'u1', role: 'engineer' }, storage)).toBeNull();
  });

  it('keeps people apart on a shared browser', () => {
    const storage = memoryStorage();
    noteRole({ id: 'u1', role: 'technician' }, storage);
    expect(noteRole({ id: 'u2', role: 'owner' }, storage)).toBeNull();
  });
});
