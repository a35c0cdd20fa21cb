/**
 * The one error path in the browser: anything that fails outside a form (a fetch for a table,
 * a lost connection) is reported here and shown by <Toasts />, mounted once in the root layout.
 */
export interface Toast {
	id: number;
	message: string;
}

/** Long enough to read a sentence at a workstation glance; each toast can also be dismissed. */
const VISIBLE_MS = 8000;

let nextId = 1;
export const toasts: Toast[] = $state([]);

export function dismissToast(id: number): void {
	const index = toasts.findIndex((t) => t.id === id);
	if (index !== -1) toasts.splice(index, 1);
}

export const toast = {
	error(message: string): void {
		// A table retrying the same failing request should not stack identical messages.
		if (toasts.some((t) => t.message === message)) return;
		const id = nextId++;
		toasts.push({ id, message });
		setTimeout(() => dismissToast(id), VISIBLE_MS);
	}
};
