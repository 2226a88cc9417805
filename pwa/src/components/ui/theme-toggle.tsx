/**
 * Light or dark theme: a class on <html> (`dark`), which src/index.css turns into the night
 * palette. The choice is remembered on this device (localStorage, a display preference only);
 * without one the theme follows the system's prefers-color-scheme, also when it changes.
 */
import { useEffect, useState } from 'react';

export type Theme = 'light' | 'dark';

export const THEME_STORAGE_KEY = 'phasewright.theme';
const DARK_QUERY = '(prefers-color-scheme: dark)';

export function storedTheme(): Theme | null {
  try {
    const v = window.localStorage.getItem(THEME_STORAGE_KEY);
    return v === 'light' || v === 'dark' ? v : null;
  } catch {
    return null; // storage blocked: follow the system
  }
}

export function systemTheme(): Theme {
  return typeof window.matchMedia === 'function' && window.matchMedia(DARK_QUERY).matches ? 'dark' : 'light';
}

/** Sets the class on <html> and the browser's theme colour (the paper of the header). */
export function applyTheme(theme: Theme): void {
  const root = document.documentElement;
  root.classList.toggle('dark', theme === 'dark');
  const paper = getComputedStyle(root).getPropertyValue('--color-paper').trim();
  const meta = document.querySelector('meta[name="theme-color"]');
  if (paper && meta) meta.setAttribute('content', paper);
}

// At import (the header loads with the shell), before the first paint of the app.
if (typeof document !== 'undefined') applyTheme(storedTheme() ?? systemTheme());

/** A small button in the header: sun in the dark theme (go light), moon in the light one. */
export function ThemeToggle() {
  const [theme, setTheme] = useState<Theme>(() => storedTheme() ?? systemTheme());
  useEffect(() => applyTheme(theme), [theme]);
  useEffect(() => {
    if (typeof window.matchMedia !== 'function') return;
    const mq = window.matchMedia(DARK_QUERY);
    const follow = () => {
      if (storedTheme() === null) setTheme(mq.matches ? 'dark' : 'light');
    };
    mq.addEventListener('change', follow);
    return () => mq.removeEventListener('change', follow);
  }, []);
  const next: Theme = theme === 'dark' ? 'light' : 'dark';
  const label = `Switch to the ${next} theme`;
  return (
    <button
      type="button"
      className="inline-flex size-8 items-center justify-center rounded-md text-ink-800 hover:bg-ink-100"
      aria-label={label}
      title={label}
      data-testid="theme-toggle"
      data-theme={theme}
      onClick={() => {
        try {
          window.localStorage.setItem(THEME_STORAGE_KEY, next);
        } catch {
          // not remembered; still switched for this page
        }
        setTheme(next);
      }}
    >
      <svg viewBox="0 0 24 24" width="18" height="18" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" aria-hidden="true">
        {theme === 'dark' ? (
          <>
            <circle cx="12" cy="12" r="4.2" />
            <path d="M12 2.5v2.2M12 19.3v2.2M2.5 12h2.2M19.3 12h2.2M5.3 5.3l1.6 1.6M17.1 17.1l1.6 1.6M5.3 18.7l1.6-1.6M17.1 6.9l1.6-1.6" />
          </>
        ) : (
          <path d="M20.3 14.6A8.5 8.5 0 0 1 9.4 3.7a8.5 8.5 0 1 0 10.9 10.9Z" />
        )}
      </svg>
    </button>
  );
}
