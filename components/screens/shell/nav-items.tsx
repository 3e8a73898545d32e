import type { ComponentType } from 'react';

import { ActivityIcon, ReviewsIcon, SettingsIcon, TeamIcon } from '@/components/ui/icons';

export type NavItem = {
  href: '/' | '/team' | '/activity' | '/settings';
  label: string;
  testID: string;
  Icon: ComponentType<{ colour: string; size?: number }>;
  /** Whether the item is the current place for a pathname. */
  matches: (pathname: string) => boolean;
};

export const navItems: NavItem[] = [
  {
    href: '/',
    label: 'Reviews',
    testID: 'nav-reviews',
    Icon: ReviewsIcon,
    matches: (p) => p === '/' || p.startsWith('/reviews'),
  },
  { href: '/team', label: 'Team', testID: 'nav-team', Icon: TeamIcon, matches: (p) => p.startsWith('/team') },
  {
    href: '/activity',
    label: 'Activity',
    testID: 'nav-activity',
    Icon: ActivityIcon,
    matches: (p) => p.startsWith('/activity'),
  },
  {
    href: '/settings',
    label: 'Settings',
    testID: 'nav-settings',
    Icon: SettingsIcon,
    matches: (p) => p.startsWith('/settings'),
  },
];
