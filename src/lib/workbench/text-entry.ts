/** Whether a key event's target is a place to type, where single-letter shortcuts must not fire. */
export const isTextEntry = (target: EventTarget | null): boolean =>
	target instanceof HTMLElement && (target.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName));
