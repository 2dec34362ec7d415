// Equipment as the farm sets it up. Widths in feet, spacings in inches (US customary).

export const EQUIPMENT_KINDS = ['planter', 'drill', 'sprayer', 'sidedress', 'combine_head', 'shelter'] as const;
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number];

export const EQUIPMENT_KIND_LABELS: Record<EquipmentKind, string> = {
	planter: 'Planter',
	drill: 'Drill or seeder',
	sprayer: 'Sprayer',
	sidedress: 'Side-dress toolbar',
	combine_head: 'Combine head',
	shelter: 'Mobile livestock shelter'
};

/** A fertilizer line on a planter or toolbar, and the crops it is meant to feed. */
export interface FertilizerLine {
	id: string; // short key, e.g. "n" or "starter"
	name: string; // e.g. "Nitrogen (UAN 32 %)"
	product: string | null;
	forCrops: string[]; // e.g. ['corn']; a line that is on over any other crop is a misplumbing
	/** The farmer's entered rate and analysis, for quantities (never a recommendation). */
	gallonsPerAcre?: number | null;
	poundsPerGallon?: number | null;
	percentN?: number | null;
}

export interface RowUnit {
	unit: number; // 1-based, numbered from the left as the operator sits facing forward
	/** What the seed box carries, or null when the unit is shut off. */
	seed: { crop: string; variety: string | null } | null;
	/** Fertilizer line ids turned on at this unit. */
	fertilizerOn: string[];
}

export interface PlanterSetup {
	rowSpacingIn: number;
	rowUnits: RowUnit[];
	fertilizerLines: FertilizerLine[];
}

export interface Equipment {
	id: string;
	name: string;
	kind: EquipmentKind;
	/** Working width in feet; for planters, rows × spacing. */
	workingWidthFt: number;
	/** Planters and side-dress toolbars: units and plumbing. */
	planter: PlanterSetup | null;
	/** Sprayers: boom sections. Combine heads: rows. Shelters: length. */
	sections: number | null;
	rows: number | null;
	lengthFt: number | null;
	notes: string | null;
	isDefaultPlanter: boolean;
	version: number;
}

/** How urgent a check is: 'stop' keeps the planter from rolling, 'warn' asks for a look. */
export type CheckSeverity = 'stop' | 'warn';

/** The broad kind a check is listed under wherever checks are shown (sheet, planning board, record book). */
export type CheckKind = 'fertilizer_wrong_crop' | 'seed_wrong_crop' | 'overhang' | 'partial_pass' | 'spacing_mismatch' | 'no_lanes' | 'other';

/** One finding of an equipment check, as every list of checks shows it. */
export interface CheckFinding {
	severity: CheckSeverity;
	kind: CheckKind;
	message: string;
	laneIndex: number | null;
	/** The first row unit concerned, or null. */
	unit: number | null;
}
