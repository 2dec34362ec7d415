import { describe, expect, it } from 'vitest';
import { can, ROLES, type Capability, type Role } from '$lib/permissions';

// The roles table exactly as the product states it, written out by hand so a change
// to the code that drifts from the design fails here.
const MATRIX: Record<Capability, Record<Role, boolean>> = {
	manageFarm: { owner: true, manager: false, crew: false, advisor: false, viewer: false },
	editPlans: { owner: true, manager: true, crew: false, advisor: false, viewer: false },
	logRecords: { owner: true, manager: true, crew: true, advisor: false, viewer: false },
	scout: { owner: true, manager: true, crew: true, advisor: true, viewer: false },
	read: { owner: true, manager: true, crew: true, advisor: true, viewer: true }
};

describe('permission matrix', () => {
	for (const capability of Object.keys(MATRIX) as Capability[]) {
		for (const role of ROLES) {
			const allowed = MATRIX[capability][role];
			it(`${role} ${allowed ? 'may' : 'may not'} ${capability}`, () => {
				expect(can(role, capability)).toBe(allowed);
			});
		}
	}
});
