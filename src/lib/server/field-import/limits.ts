export const IMPORT_LIMITS = {
	maxUploadBytes: 10 * 1024 * 1024,
	maxUnzippedBytes: 50 * 1024 * 1024,
	maxZipEntries: 200
};

export function megabytes(bytes: number): string {
	return `${Math.round(bytes / (1024 * 1024))} MB`;
}
