/**
 * Where each role works: the sections of /app and, per role, which of them appear in the
 * navigation and in what order. The first section of a role is that role's home after sign-in.
 * The router (app/router.tsx) gives each section its page; later features replace the page,
 * not this table.
 */
import type { Role } from '../../shared/schemas/roles';

export type SectionId =
  | 'users' | 'lab' | 'mail' | 'audit'
  | 'templates' | 'standards' | 'customers'
  | 'jobs' | 'review' | 'certificates' | 'my-certificates';

export interface Section {
  id: SectionId;
  /** Path under /app. */
  path: string;
  label: string;
  /** Roles that may open it. */
  roles: readonly Role[];
  /** Roles that see it without changing anything. */
  viewOnly?: readonly Role[];
}

export const SECTIONS: Record<SectionId, Section> = {
  users: { id: 'users', path: 'users', label: 'Users and roles', roles: ['admin'] },
  lab: { id: 'lab', path: 'lab', label: 'Laboratory details', roles: ['admin'] },
  mail: { id: 'mail', path: 'mail', label: 'E-mail log', roles: ['admin', 'quality_manager'] },
  audit: { id: 'audit', path: 'audit', label: 'Audit log', roles: ['admin', 'quality_manager'] },
  templates: { id: 'templates', path: 'templates', label: 'Measurement models', roles: ['quality_manager'] },
  standards: { id: 'standards', path: 'standards', label: 'Reference standards', roles: ['quality_manager', 'analyst'], viewOnly: ['analyst'] },
  customers: { id: 'customers', path: 'customers', label: 'Customers', roles: ['quality_manager', 'analyst'], viewOnly: ['analyst'] },
  jobs: { id: 'jobs', path: 'jobs', label: 'Calibration jobs', roles: ['analyst'] },
  review: { id: 'review', path: 'review', label: 'Awaiting review', roles: ['signatory'] },
  certificates: { id: 'certificates', path: 'certificates', label: 'Issued certificates', roles: ['signatory', 'quality_manager'] },
  'my-certificates': { id: 'my-certificates', path: 'my-certificates', label: 'My certificates', roles: ['customer'] },
};

export const NAVIGATION: Record<Role, readonly SectionId[]> = {
  admin: ['users', 'lab', 'audit', 'mail'],
  quality_manager: ['templates', 'standards', 'customers', 'certificates', 'audit', 'mail'],
  analyst: ['jobs', 'standards', 'customers'],
  signatory: ['review', 'certificates'],
  customer: ['my-certificates'],
};

export function navigationFor(role: Role): Section[] {
  return NAVIGATION[role].map((id) => SECTIONS[id]);
}

export function canOpen(section: Section, role: Role): boolean {
  return section.roles.includes(role);
}

export function isViewOnly(section: Section, role: Role): boolean {
  return section.viewOnly?.includes(role) ?? false;
}

/** Where a role lands after sign-in. */
export function homePathFor(role: Role): string {
  return `/app/${SECTIONS[NAVIGATION[role][0]].path}`;
}

/** A `next` path from the sign-in URL, kept only if it is inside /app and the role may open it. */
export function safeNextPath(next: string | null, role: Role): string | null {
  if (!next || !next.startsWith('/app/') || next.startsWith('//')) return null;
  const first = next.slice('/app/'.length).split(/[/?#]/)[0];
  const section = Object.values(SECTIONS).find((s) => s.path === first);
  return section && canOpen(section, role) ? next : null;
}
