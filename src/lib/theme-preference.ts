/**
 * The theme each user chose, kept in this browser (per user, and the last one for the sign-in page), set
 * on <html data-theme>. The tokens' values are injected once from src/config/theme.ts.
 */
import { useSyncExternalStore } from 'react';
import { themeCss, type ThemeName } from '../config/theme';

const LAST = 'fanlight.theme.last';
const keyOf = (userId: number) => `fanlight.theme.v1.${userId}`;

function stored(key: string): ThemeName | null {
  try {
    const v = localStorage.getItem(key);
    return v === 'light' || v === 'dark' ? v : null;
  } catch {
    return null;
  }
}

export function applyTheme(theme: ThemeName): void {
  document.documentElement.dataset.theme = theme;
}

/** At start-up: the variables, and the last theme shown in this browser. */
export function installTheme(): void {
  const style = document.createElement('style');
  style.dataset.fanlight = 'theme';
  style.textContent = themeCss();
  document.head.appendChild(style);
  applyTheme(stored(LAST) ?? 'dark');
}

export const themeOf = (userId: number | null): ThemeName => (userId === null ? stored(LAST) : (stored(keyOf(userId)) ?? stored(LAST))) ?? 'dark';

export function chooseTheme(userId: number | null, theme: ThemeName): void {
  applyTheme(theme);
  try {
    localStorage.setItem(LAST, theme);
    if (userId !== null) localStorage.setItem(keyOf(userId), theme);
  } catch {
    // private mode: this visit only
  }
}

const subscribeTheme = (onChange: () => void) => {
  const observer = new MutationObserver(onChange);
  observer.observe(document.documentElement, { attributes: true, attributeFilter: ['data-theme'] });
  return () => observer.disconnect();
};
const currentTheme = () => document.documentElement.dataset.theme ?? 'dark';

/** The theme shown now, re-rendering on a switch (canvases and plots draw again: they do not follow CSS). */
export const useThemeShown = (): string => useSyncExternalStore(subscribeTheme, currentTheme, () => 'dark');
