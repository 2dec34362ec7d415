/**
 * A tooltip, popup or icon body holding `text` as plain text. Leaflet writes a string content in as
 * HTML, so user text (field, exclusion, crop and imported shape names) must go in through this.
 */
export function textLabel(text: string, className?: string): HTMLElement {
	const element = document.createElement('span');
	if (className) element.className = className;
	element.textContent = text;
	return element;
}
