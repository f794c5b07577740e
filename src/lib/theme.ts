import { useCallback, useSyncExternalStore } from 'react';

/**
 * Two themes: `paper` (light, for the day list and forms) and `dim` (for a darkened procedure room).
 * Each kind of screen keeps its own choice: capture screens start dim, the others start paper.
 * public/theme-boot.js reads the same key before the first paint.
 */
export type Theme = 'paper' | 'dim';
export type ThemeScope = 'general' | 'capture';

const KEY = 'ledgerline.theme';
const defaults: Record<ThemeScope, Theme> = { general: 'paper', capture: 'dim' };
const listeners = new Set<() => void>();

function read(): Partial<Record<ThemeScope, Theme>> {
  try {
    const value: unknown = JSON.parse(localStorage.getItem(KEY) ?? '{}');
    return value && typeof value === 'object' ? (value as Partial<Record<ThemeScope, Theme>>) : {};
  } catch {
    return {};
  }
}

export function themeFor(scope: ThemeScope): Theme {
  const chosen = read()[scope];
  return chosen === 'dim' || chosen === 'paper' ? chosen : defaults[scope];
}

export function chooseTheme(scope: ThemeScope, theme: Theme): void {
  localStorage.setItem(KEY, JSON.stringify({ ...read(), [scope]: theme }));
  listeners.forEach((l) => l());
}

export function applyTheme(theme: Theme): void {
  document.documentElement.dataset.theme = theme;
  document.querySelector('meta[name="theme-color"]')?.setAttribute('content', theme === 'dim' ? '#0f1215' : '#16324f');
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => e.key === KEY && listener();
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

/** The theme of a scope and a toggle; the caller applies it (see the root layout). */
export function useTheme(scope: ThemeScope): [Theme, (t: Theme) => void] {
  const theme = useSyncExternalStore(subscribe, () => themeFor(scope));
  const set = useCallback((t: Theme) => chooseTheme(scope, t), [scope]);
  return [theme, set];
}
