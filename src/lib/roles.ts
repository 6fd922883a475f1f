import { errors } from './errors';

export const ROLES = ['contractor', 'homeowner', 'inspector', 'administrator'] as const;
export type Role = (typeof ROLES)[number];

export interface FirmLink {
	id: string;
	name: string;
	memberRole: 'owner' | 'member';
}

export interface CurrentUser {
	id: string;
	email: string;
	name: string;
	roles: Role[];
	firms: FirmLink[];
	/** Jurisdictions the user works for: as an inspector, or as its administrator (who also inspects). */
	jurisdictions: { id: string; name: string; staffRole: 'inspector' | 'administrator' }[];
	propertyIds: string[];
}

export const ROLE_LABELS: Record<Role, string> = {
	contractor: 'Contractor',
	homeowner: 'Homeowner',
	inspector: 'Inspector',
	administrator: 'Administrator',
};

/** Where each role starts after signing in. */
export const START_PAGES: Record<Role, string> = {
	contractor: '/contractor',
	homeowner: '/homeowner',
	inspector: '/inspector',
	administrator: '/admin',
};

/** Which role a path prefix belongs to; pages and API routes under it need that role. */
const AREA_ROLES: [prefix: string, role: Role][] = [
	['/contractor', 'contractor'],
	['/api/contractor', 'contractor'],
	['/homeowner', 'homeowner'],
	['/api/homeowner', 'homeowner'],
	['/inspector', 'inspector'],
	['/api/inspector', 'inspector'],
	['/admin', 'administrator'],
	['/api/admin', 'administrator'],
];

/** Paths anyone may open without signing in. */
const PUBLIC_PATHS = ['/', '/sign-in', '/sign-up', '/api/sign-up', '/api/health'];
// '/map/' pages open a home's panel map by the random link on its directory card.
const PUBLIC_PREFIXES = ['/api/auth/', '/_astro/', '/favicon', '/map/'];

export function isPublicPath(pathname: string): boolean {
	return PUBLIC_PATHS.includes(pathname) || PUBLIC_PREFIXES.some((p) => pathname.startsWith(p));
}

/** The role a path demands, if any. */
export function roleForPath(pathname: string): Role | null {
	for (const [prefix, role] of AREA_ROLES) {
		if (pathname === prefix || pathname.startsWith(prefix + '/')) return role;
	}
	return null;
}

export function hasRole(user: CurrentUser | null, role: Role): boolean {
	return !!user && user.roles.includes(role);
}

/** The first start page for a user's roles (administrator last: it is the rarest daily view). */
export function startPageFor(user: CurrentUser): string {
	const order: Role[] = ['contractor', 'inspector', 'homeowner', 'administrator'];
	const role = order.find((r) => user.roles.includes(r));
	return role ? START_PAGES[role] : '/account';
}

/** Throws 401 when nobody is signed in. */
export function requireUser(user: CurrentUser | null): CurrentUser {
	if (!user) throw errors.unauthenticated();
	return user;
}

/** Throws 401 when signed out and 403 when the user lacks the role. */
export function requireRole(user: CurrentUser | null, role: Role): CurrentUser {
	const u = requireUser(user);
	if (!u.roles.includes(role)) throw errors.forbidden();
	return u;
}

/** A contractor reaches only their own firms; an administrator reaches every firm. */
export function canReadFirm(user: CurrentUser, firmId: string): boolean {
	return user.roles.includes('administrator') || user.firms.some((f) => f.id === firmId);
}

export function canManageFirm(user: CurrentUser, firmId: string): boolean {
	return (
		user.roles.includes('administrator') ||
		user.firms.some((f) => f.id === firmId && f.memberRole === 'owner')
	);
}

/** Whether the user administers a jurisdiction's settings (its staff administrator, or a site administrator). */
export function canManageJurisdiction(user: CurrentUser, jurisdictionId: string): boolean {
	return (
		user.roles.includes('administrator') ||
		user.jurisdictions.some((j) => j.id === jurisdictionId && j.staffRole === 'administrator')
	);
}
