// What Field and SelectField take for their frame (label, hint, error), apart from the attributes that go
// on the control itself.
import type { Snippet } from 'svelte';

export interface FrameProps {
	label: string;
	name: string;
	/** Default `field-{name}`. */
	id?: string;
	error?: string;
	hint?: string | Snippet;
	/** Show the hint beside an error too. */
	keepHint?: boolean;
}

export function splitFieldProps<P extends FrameProps>(props: P) {
	const { label, name, id, error, hint, keepHint, ...control } = props;
	return { frame: { id: id ?? `field-${name}`, label, error, hint, keepHint }, name, control };
}
