import type { ToothNumberingSystem } from '@torquetrail/domain';
import { useSyncExternalStore } from 'react';

/** Which numbering the user reads teeth in. A display preference only: data is always FDI. */
export type ToothSystem = ToothNumberingSystem;

const STORAGE_KEY = 'torquetrail.toothSystem';
const listeners = new Set<() => void>();

function readStorage(): ToothSystem {
  try {
    return window.localStorage.getItem(STORAGE_KEY) === 'universal' ? 'universal' : 'fdi';
  } catch {
    return 'fdi';
  }
}

let current: ToothSystem | undefined;

function getSnapshot(): ToothSystem {
  current ??= readStorage();
  return current;
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  const onStorage = (event: StorageEvent) => {
    if (event.key !== STORAGE_KEY) return;
    current = readStorage();
    listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

function setToothSystem(next: ToothSystem): void {
  current = next;
  try {
    window.localStorage.setItem(STORAGE_KEY, next);
  } catch {
    // Storage may be disabled: the choice then lasts until the page reloads.
  }
  listeners.forEach((listener) => listener());
}

/** The remembered numbering system, shared by every component that shows tooth numbers. */
export function useToothSystem(): [ToothSystem, (system: ToothSystem) => void] {
  const system = useSyncExternalStore(subscribe, getSnapshot, () => 'fdi' as const);
  return [system, setToothSystem];
}
