/**
 * Which screen is showing. Screens are addressed by id; the hash in the address bar mirrors
 * the current screen so reloading the page (browser mode) comes back to it.
 */
import type { MenuCommand } from '../../../../main/ipc-contract';

export const SCREENS = [
  { id: 'workspaces', label: 'Workspaces', key: '0' },
  { id: 'accounts', label: 'Accounts & statements', key: '1' },
  { id: 'transactions', label: 'Transactions', key: '2' },
  { id: 'recurring', label: 'Recurring flows', key: '3' },
  { id: 'outlook', label: 'Outlook', key: '4' },
  { id: 'patterns', label: 'Patterns', key: '5' },
  { id: 'scenarios', label: 'Scenarios', key: '6' },
  { id: 'report', label: 'Report', key: '7' },
] as const;

export type ScreenId = (typeof SCREENS)[number]['id'];

const MENU_SCREENS: Partial<Record<MenuCommand, ScreenId>> = {
  'show-accounts': 'accounts',
  'show-transactions': 'transactions',
  'show-recurring': 'recurring',
  'show-forecast': 'outlook',
  'show-patterns': 'patterns',
  'show-scenarios': 'scenarios',
  'show-report': 'report',
};

function isScreen(id: string): id is ScreenId {
  return SCREENS.some((s) => s.id === id);
}

export class Navigation {
  #screen = $state<ScreenId>('workspaces');

  constructor() {
    const fromHash = location.hash.replace(/^#\/?/, '');
    if (isScreen(fromHash)) this.#screen = fromHash;
  }

  get screen(): ScreenId {
    return this.#screen;
  }

  go(screen: ScreenId): void {
    this.#screen = screen;
    if (location.hash !== `#/${screen}`) history.replaceState(null, '', `#/${screen}`);
  }

  /** Screen a menu command opens, if any. */
  static screenFor(command: MenuCommand): ScreenId | undefined {
    return MENU_SCREENS[command];
  }
}
