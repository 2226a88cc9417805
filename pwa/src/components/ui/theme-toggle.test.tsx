import { fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import initScript from '../../../public/theme-init.js?raw';
import { storedTheme, systemTheme, THEME_STORAGE_KEY, ThemeToggle } from './theme-toggle.js';

function systemPrefersDark(dark: boolean) {
  vi.stubGlobal('matchMedia', (query: string) => ({ matches: dark && query === '(prefers-color-scheme: dark)', addEventListener: () => {}, removeEventListener: () => {} }));
}

afterEach(() => {
  window.localStorage.clear();
  document.documentElement.classList.remove('dark');
});

describe('ThemeToggle', () => {
  it('without a stored choice follows prefers-color-scheme', () => {
    systemPrefersDark(true);
    render(<ThemeToggle />);
    expect(document.documentElement.classList.contains('dark')).toBe(true);
    expect(screen.getByRole('button', { name: 'Switch to the light theme' })).toBeTruthy();
  });

  it('a click switches the class on <html> and remembers the choice; the choice wins over the system', () => {
    systemPrefersDark(false);
    const first = render(<ThemeToggle />);
    expect(document.documentElement.classList.contains('dark')).toBe(false);
    fireEvent.click(screen.getByRole('button', { name: 'Switch to the dark theme' }));
    expect(document.documentElement.classList.contains('dark')).toBe(true);
    expect(window.localStorage.getItem(THEME_STORAGE_KEY)).toBe('dark');
    first.unmount();
    render(<ThemeToggle />);
    expect(screen.getByTestId('theme-toggle').getAttribute('data-theme')).toBe('dark');
    fireEvent.click(screen.getByRole('button', { name: 'Switch to the light theme' }));
    expect(document.documentElement.classList.contains('dark')).toBe(false);
    expect(window.localStorage.getItem(THEME_STORAGE_KEY)).toBe('light');
  });
});

describe('public/theme-init.js (runs before the app, against a light flash)', () => {
  const runInit = () => new Function(initScript)();
  it.each([
    [null, false],
    [null, true],
    ['dark', false],
    ['light', true],
  ] as const)('stored %s, system dark %s: the same theme as the app chooses', (stored, dark) => {
    systemPrefersDark(dark);
    if (stored) window.localStorage.setItem(THEME_STORAGE_KEY, stored);
    runInit();
    expect(document.documentElement.classList.contains('dark')).toBe((storedTheme() ?? systemTheme()) === 'dark');
  });
  it('uses the storage key of the app', () => {
    expect(initScript).toContain(`'${THEME_STORAGE_KEY}'`);
  });
});
