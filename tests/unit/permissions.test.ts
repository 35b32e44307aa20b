// The README's "Who does what" table and src/lib/permissions.ts say the same: every action
// appears once, with a mark under exactly the roles the table allows.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { can, permissions, type Action } from '$lib/permissions';
import { roles, roleLabels } from '$lib/roles';
import { editableFields, plantingFieldNames, recordFields } from '$lib/schemas/planting';

function readmeTable(): { header: string[]; rows: string[][] } {
	const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
	const cells = (l: string) =>
		l
			.split('|')
			.slice(1, -1)
			.map((c) => c.trim());
	const table: string[][] = [];
	for (const line of readme.slice(readme.indexOf('## Who does what')).split('\n').slice(1)) {
		if (line.startsWith('|')) table.push(cells(line));
		else if (table.length) break;
	}
	return { header: table[0], rows: table.slice(2) };
}

describe('permissions', () => {
	const { header, rows } = readmeTable();

	it('the README table has one column per role', () => {
		expect(header.slice(1)).toEqual(roles.map((r) => roleLabels[r].toLowerCase()));
	});

	it('names every action of the table once, and no other', () => {
		const named = rows.map((r) => r[0].match(/\(`([a-z.]+)`\)$/)?.[1]);
		expect(named.every(Boolean)).toBe(true);
		expect([...named].sort()).toEqual(Object.keys(permissions).sort());
	});

	for (const row of rows) {
		const action = row[0].match(/\(`([a-z.]+)`\)$/)?.[1] as Action;
		it(`marks ${action} for exactly the roles that may take it`, () => {
			roles.forEach((role, i) =>
				expect({ role, marked: row[i + 1] === '✓' }).toEqual({ role, marked: can(role, action) })
			);
		});
	}

	it("gives the planting's editable fields by permission: all to plan.edit, the record to planting.record, none otherwise", () => {
		for (const role of roles) {
			const fields = editableFields(role);
			if (can(role, 'plan.edit')) expect(fields).toEqual(plantingFieldNames);
			else if (can(role, 'planting.record')) expect(fields).toEqual(recordFields);
			else expect(fields).toEqual([]);
		}
		expect(editableFields('crew_lead')).toEqual([
			'status',
			'actualTraySowDate',
			'actualFieldDate',
			'actualFirstHarvest',
			'actualLastHarvest',
			'notes'
		]);
		expect(editableFields('share_manager')).toEqual([]);
	});
});
