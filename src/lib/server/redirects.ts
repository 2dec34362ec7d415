/** A same-site path to go to after sign-in; anything else falls back to the farm list. */
export function safeRedirectTarget(value: string | null | undefined): string {
	if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return '/farms';
	return value;
}
