// Every server entry point under src/routes, read from the file system: each page (its load,
// whether from +page.server.ts, a layout or none), each named form action of a +page.server.ts,
// and each HTTP method a +server.ts exports. The access table test fails for any entry that has
// no row, so a new route cannot slip in unchecked.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

export interface RouteEntry {
	/** 'route-id what', e.g. '(app)/seasons/[id]/demand action:saveShare' or 'api/plantings/[id] PATCH'. */
	key: string;
	routeId: string;
	what: string;
	file: string;
}

const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'HEAD', 'OPTIONS', 'fallback'];

function walk(dir: string): string[] {
	const out: string[] = [];
	for (const name of readdirSync(dir)) {
		const p = join(dir, name);
		if (statSync(p).isDirectory()) out.push(...walk(p));
		else out.push(p);
	}
	return out;
}

/** The names of a +page.server.ts's form actions ('default' for an unnamed one). */
export function actionNames(source: string): string[] {
	const start = source.search(/export const actions\b[^=]*=\s*\{/);
	if (start < 0) return [];
	const body = source.slice(start);
	const end = body.search(/\n\}/);
	const block = end < 0 ? body : body.slice(0, end);
	const names = new Set<string>();
	for (const m of block.matchAll(/^\t(?:async\s+)?([A-Za-z_$][\w$]*)\s*(?::|\()/gm)) names.add(m[1]);
	return [...names];
}

/** The HTTP methods a +server.ts exports. */
export function exportedMethods(source: string): string[] {
	const found = new Set<string>();
	for (const m of source.matchAll(/export\s+(?:const|async\s+function|function)\s+([A-Za-z]+)\b/g))
		if (METHODS.includes(m[1])) found.add(m[1]);
	for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
		for (const part of m[1].split(',')) {
			const name =
				part
					.trim()
					.split(/\s+as\s+/)
					.pop() ?? '';
			if (METHODS.includes(name)) found.add(name);
		}
	}
	return [...found];
}

export function listRoutes(root = join(process.cwd(), 'src', 'routes')): RouteEntry[] {
	const entries: RouteEntry[] = [];
	for (const file of walk(root).sort()) {
		const base = file.split(sep).pop() ?? '';
		const routeId = relative(root, file).split(sep).slice(0, -1).join('/') || '.';
		const add = (what: string) =>
			entries.push({ key: `${routeId} ${what}`, routeId, what, file: relative(process.cwd(), file) });
		if (base === '+page.svelte') add('page');
		else if (base === '+page.server.ts')
			for (const name of actionNames(readFileSync(file, 'utf8'))) add(`action:${name}`);
		else if (base === '+server.ts') for (const method of exportedMethods(readFileSync(file, 'utf8'))) add(method);
	}
	// A +page.server.ts without a +page.svelte (signout) still answers GET through its load.
	for (const file of walk(root)) {
		if (!file.endsWith(`${sep}+page.server.ts`)) continue;
		const routeId = relative(root, file).split(sep).slice(0, -1).join('/') || '.';
		if (
			/export const load\b/.test(readFileSync(file, 'utf8')) &&
			!entries.some((e) => e.routeId === routeId && e.what === 'page')
		) {
			entries.push({ key: `${routeId} page`, routeId, what: 'page', file: relative(process.cwd(), file) });
		}
	}
	return entries;
}
