import type { Role } from '@shared/roles';
import type { CellarScreenName } from '@/router/routes';

export interface NavItem {
  name: CellarScreenName;
  label: string;
  icon: string;
  /** Shown in the phone's bottom bar. */
  inBottomBar?: boolean;
  /** Shown only to members with at least this role. */
  least?: Role;
}

export interface NavGroup {
  title: string;
  items: NavItem[];
}

/** The screens of the brief, grouped as a cellar hand uses them. */
export const NAV_GROUPS: NavGroup[] = [
  {
    title: 'Cellar',
    items: [
      { name: 'today', label: 'Today', icon: 'wb_twilight', inBottomBar: true },
      { name: 'scan', label: 'Scan', icon: 'qr_code_scanner', inBottomBar: true },
      { name: 'batches', label: 'Batches', icon: 'science', inBottomBar: true },
      { name: 'vessels', label: 'Vessels', icon: 'propane_tank', inBottomBar: true },
      { name: 'bottles', label: 'Bottles', icon: 'wine_bar' },
      { name: 'cellar-map', label: 'Cellar map', icon: 'grid_view' },
    ],
  },
  {
    title: 'Tools',
    items: [
      { name: 'tasks', label: 'Tasks', icon: 'event_note' },
      { name: 'labels', label: 'Labels', icon: 'qr_code_2' },
      { name: 'calculators', label: 'Calculators', icon: 'calculate' },
      { name: 'settings', label: 'Settings', icon: 'tune' },
      { name: 'audit', label: 'Audit', icon: 'manage_history', least: 'keeper' },
    ],
  },
];
