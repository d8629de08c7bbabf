import type { Rule, Role } from './server/auth.ts';
import { allows } from './server/auth.ts';

/** One screen of the app: where it lives, who may open it, and whether it is built yet. */
export interface Screen {
  href: string;
  label: string;
  rule: Exclude<Rule, 'public'>;
  ready: boolean;
  blurb: string;
}

/**
 * Every screen, in navigation order. The middleware gates pages with these rules and the layout
 * builds each role's navigation from them; a screen not built yet shows as such, with no content.
 */
export const SCREENS: Screen[] = [
  { href: '/dispatch', label: 'Dispatch', rule: 'dispatcher', ready: true, blurb: 'Plan a day for the whole team on the map and the board.' },
  { href: '/day', label: 'Day sheet', rule: 'signed-in', ready: true, blurb: 'Your stops in order, with directions and horse notes.' },
  { href: '/due', label: 'Due list', rule: 'dispatcher', ready: true, blurb: 'Horses coming due, overdue first.' },
  { href: '/horses', label: 'Horses', rule: 'dispatcher', ready: true, blurb: 'Every horse, its cycle, work and history.' },
  { href: '/barns', label: 'Barns', rule: 'dispatcher', ready: true, blurb: 'Where horses are kept, access hours and notes.' },
  { href: '/owners', label: 'Owners', rule: 'dispatcher', ready: true, blurb: 'Clients, phone numbers and text consent.' },
  { href: '/work-types', label: 'Work types', rule: 'dispatcher', ready: true, blurb: 'Minutes, forge and qualification per kind of work.' },
  { href: '/map', label: 'Region map', rule: 'signed-in', ready: true, blurb: 'Barns and farrier homes on the practice map.' },
  { href: '/messages', label: 'Messages', rule: 'dispatcher', ready: true, blurb: 'Texts and e-mails sent to owners and farriers.' },
  { href: '/team', label: 'Team', rule: 'lead', ready: true, blurb: 'People who sign in, and invitations.' },
  { href: '/review', label: 'Review', rule: 'lead', ready: true, blurb: 'Overtime and mileage, planned against actual.' },
  { href: '/settings', label: 'Settings', rule: 'lead', ready: true, blurb: 'Time zone, units, mileage rate and overtime rule.' },
];

/** The screens a role may open. */
export function screensFor(role: Role): Screen[] {
  return SCREENS.filter((s) => allows(s.rule, role));
}

/** The rule of the screen a path belongs to, if any. */
export function screenFor(pathname: string): Screen | undefined {
  return SCREENS.find((s) => pathname === s.href || pathname.startsWith(`${s.href}/`));
}
