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
		const moved = moveLast(this.undoStack, this.redoStack);
		if (moved) [this.undoStack, this.redoStack] = [moved.from, moved.to];
		return moved?.step;
	}

	/** The step to redo, moved back to the undo list. */
	takeRedo(): EditStep | undefined {
		const moved = moveLast(this.redoStack, this.undoStack);
		if (moved) [this.redoStack, this.undoStack] = [moved.from, moved.to];
		return moved?.step;
	}
}

/** The last step of one list moved onto the end of the other, as new lists; null when `from` is empty. */
function moveLast(from: EditStep[], to: EditStep[]): { step: EditStep; from: EditStep[]; to: EditStep[] } | null {
	const step = from.at(-1);
	return step ? { step, from: from.slice(0, -1), to: [...to, step] } : null;
}

/** What the message line says after undo or redo. */
export function replayMessage(e: EditStep, backwards: boolean): string {
	const n = e.kind === 'cells' ? e.changes.length : 0;
	const what =
		e.kind === 'cells' ? `${n} change${n === 1 ? '' : 's'}` : e.kind === 'add' ? 'adding rows' : 'removing rows';
	return `${backwards ? 'Undid' : 'Redid'} ${what}.`;
}
