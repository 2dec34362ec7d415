// What the product form holds, as typed; shared by the form component and the page actions.
export interface ProductFormValues {
	name: string;
	kind: string;
	unit: string;
	epaRegNo: string;
	restrictedUse: boolean;
	reiHours: string;
	phiDays: string;
	grazingDays: string;
	activeIngredients: string;
	formulation: string;
	analysis: string;
	poundsPerGallon: string;
	notes: string;
	version: string;
}

export function emptyProductValues(kind = 'herbicide'): ProductFormValues {
	return { name: '', kind, unit: 'pt', epaRegNo: '', restrictedUse: false, reiHours: '', phiDays: '', grazingDays: '', activeIngredients: '', formulation: '', analysis: '', poundsPerGallon: '', notes: '', version: '' };
}

export const KIND_LABELS: Record<string, string> = {
	herbicide: 'Herbicide',
	insecticide: 'Insecticide',
	fungicide: 'Fungicide',
	fertilizer: 'Fertilizer',
	'seed-treatment': 'Seed treatment',
	other: 'Other'
};

/** An interval for reading: "24 h", "60 days", or "—" when the label gives none. */
export function interval(value: number | null, unit: 'h' | 'days'): string {
	if (value === null) return '—';
	return unit === 'h' ? `${value.toLocaleString('en-US')} h` : `${value.toLocaleString('en-US')} ${value === 1 ? 'day' : 'days'}`;
}
