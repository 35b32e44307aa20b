// The grid's undo and redo: a bounded list of steps (cells changed, rows added, rows removed).
// It only keeps the steps; the grid state plays them back.
import type { PlantingField } from '$lib/plantings/fields';
import type { GridRow } from './rows';

export interface Change {
	key: string;
	field: PlantingField;
	before: unknown;
	after: unknown;
}
export type EditStep =
	{ kind: 'cells'; changes: Change[] } | { kind: 'add'; rows: GridRow[] } | { kind: 'remove'; rows: GridRow[] };

export const UNDO_LIMIT = 200;

export class EditHistory {
	undoStack = $state.raw<EditStep[]>([]);
	redoStack = $state.raw<EditStep[]>([]);

	/** A new step: the oldest falls off past UNDO_LIMIT, and what was undone can no longer be redone. */
	push(e: EditStep): void {
		const next = [...this.undoStack, e];
		this.undoStack = next.length > UNDO_LIMIT ? next.slice(next.length - UNDO_LIMIT) : next;
		this.redoStack = [];
	}

	/** The step to undo, moved over to the redo list; undefined when there is none. */
	takeUndo(): EditStep | undefined {
		const e = this.undoStack.at(-1);
		if (!e) return undefined;
		this.undoStack = this.undoStack.slice(0, -1);
		this.redoStack = [...this.redoStack, e];
		return e;
	}

	/** The step to redo, moved back to the undo list. */
	takeRedo(): EditStep | undefined {
		const e = this.redoStack.at(-1);
		if (!e) return undefined;
		this.redoStack = this.redoStack.slice(0, -1);
		this.undoStack = [...this.undoStack, e];
		return e;
	}
}

/** What the message line says after undo or redo. */
export function replayMessage(e: EditStep, backwards: boolean): string {
	const n = e.kind === 'cells' ? e.changes.length : 0;
	const what =
		e.kind === 'cells' ? `${n} change${n === 1 ? '' : 's'}` : e.kind === 'add' ? 'adding rows' : 'removing rows';
	return `${backwards ? 'Undid' : 'Redid'} ${what}.`;
}
