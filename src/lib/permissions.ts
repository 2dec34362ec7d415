// The permission matrix of the product, shared by the server (access checks) and the pages (what to show).

export const ROLES = ['owner', 'manager', 'crew', 'advisor', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
	owner: 'Owner',
	manager: 'Manager',
	crew: 'Crew',
	advisor: 'Advisor',
	viewer: 'Viewer'
};

export const ROLE_SUMMARIES: Record<Role, string> = {
	owner: 'Everything, including members, farm settings and deleting the farm',
	manager: 'Edits fields, plans, equipment, products and share links; logs records',
	crew: 'Logs operations, grazing moves, rainfall and harvest; reads plans',
	advisor: 'Adds scouting notes and photos; reads plans and records',
	viewer: 'Reads plans, sheets, records and reports of the fields granted'
};

export type Capability = 'manageFarm' | 'editPlans' | 'logRecords' | 'scout' | 'read';

/** Which roles hold each capability: the product's roles table (owner, manager, crew, advisor, viewer). */
export const CAPABILITY_ROLES: Record<Capability, readonly Role[]> = {
	manageFarm: ['owner'],
	editPlans: ['owner', 'manager'],
	logRecords: ['owner', 'manager', 'crew'],
	scout: ['owner', 'manager', 'crew', 'advisor'],
	read: ['owner', 'manager', 'crew', 'advisor', 'viewer']
};

export const CAPABILITY_LABELS: Record<Capability, string> = {
	manageFarm: 'manage members and farm settings',
	editPlans: 'edit fields, plans, equipment and products',
	logRecords: 'log operations, grazing moves, rainfall and harvest',
	scout: 'add scouting notes and photos',
	read: 'read this farm'
};

export function can(role: Role, capability: Capability): boolean {
	return CAPABILITY_ROLES[capability].includes(role);
}

export function isRole(value: unknown): value is Role {
	return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
