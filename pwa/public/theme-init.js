// Puts the dark class on <html> before the first paint, so a dark-theme user sees no light flash
// while the app loads (a file, not an inline script: the server's Content-Security-Policy allows
// scripts from this origin only). src/components/ui/theme-toggle.tsx owns the theme afterwards;
// the key and the rule are the same: a stored choice, else the system's preference.
try {
  var choice = window.localStorage.getItem('phasewright.theme');
  if (choice === 'dark' || (choice !== 'light' && window.matchMedia('(prefers-color-scheme: dark)').matches)) {
    document.documentElement.classList.add('dark');
  }
} catch (_error) {
  // Storage blocked: the app applies the system theme when it starts.
}
