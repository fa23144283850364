/**
 * Light or dark theme: follows the system until the user picks one, then remembers it.
 */
type Mode = 'light' | 'dark';
const KEY = 'ebbline.theme';

export class Theme {
  #mode = $state<Mode>('light');

  constructor() {
    const saved = localStorage.getItem(KEY);
    this.#mode =
      saved === 'dark' || saved === 'light'
        ? saved
        : matchMedia('(prefers-color-scheme: dark)').matches
          ? 'dark'
          : 'light';
    this.#apply();
  }

  get mode(): Mode {
    return this.#mode;
  }

  toggle(): void {
    this.#mode = this.#mode === 'dark' ? 'light' : 'dark';
    localStorage.setItem(KEY, this.#mode);
    this.#apply();
  }

  #apply(): void {
    document.documentElement.dataset.theme = this.#mode;
  }
}
