import { type Role } from '@kerfwright/contracts';
import { paths } from './paths';

export interface NavItem {
  label: string;
  href: string;
  /** Roles that may open the page. A supervisor may do everything, so always listed. */
  roles: readonly Role[];
  /** Matches only the exact path (for Home, which is the prefix of every path). */
  end?: boolean;
}

/**
 * The side navigation. Only pages that exist are listed, and each role sees only what it may use;
 * the API enforces the same rules on every route.
 */
export const NAV_ITEMS: readonly NavItem[] = [
  {
    label: 'Home',
    href: paths.home.getHref(),
    roles: ['hobbyist', 'fabricator', 'operator', 'supervisor'],
    end: true,
  },
  {
    label: 'Designs',
    href: paths.designs.getHref(),
    roles: ['hobbyist', 'fabricator', 'operator', 'supervisor'],
  },
  { label: 'Jobs', href: paths.jobs.getHref(), roles: ['hobbyist', 'fabricator', 'operator', 'supervisor'] },
  { label: 'Release desk', href: paths.releaseDesk.getHref(), roles: ['operator', 'supervisor'] },
  {
    label: 'Safety',
    href: paths.safety.getHref(),
    roles: ['hobbyist', 'fabricator', 'operator', 'supervisor'],
  },
  { label: 'Materials', href: paths.materials.getHref(), roles: ['fabricator', 'supervisor'] },
  { label: 'Machine profiles', href: paths.machineProfiles.getHref(), roles: ['fabricator', 'supervisor'] },
  { label: 'Approvals', href: paths.approvals.getHref(), roles: ['supervisor'] },
  { label: 'People', href: paths.people.getHref(), roles: ['supervisor'] },
  { label: 'Audit trail', href: paths.audit.getHref(), roles: ['supervisor'] },
];

export function navigationFor(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => item.roles.includes(role));
}
