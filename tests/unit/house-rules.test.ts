// The layout rules DEVELOPERS.md states, checked over the source tree: no import circle under
// src, nothing under src/lib/server importing the UI folder, no source file over 400 lines but
// data, no `any` on database rows. Common practice (no published source): small acyclic modules.
import { readdirSync, readFileSync, statSync, existsSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = resolve(import.meta.dirname, '../..');
const src = join(root, 'src');

function walk(dir: string): string[] {
	return readdirSync(dir).flatMap((n) => {
		const p = join(dir, n);
		return statSync(p).isDirectory() ? walk(p) : /\.(ts|svelte)$/.test(n) && !n.endsWith('.d.ts') ? [p] : [];
	});
}

const files = walk(src);
const rel = (p: string): string => relative(root, p);

/** An import specifier to a file under src, or null (a package, a virtual module, $app, ./$types). */
function resolveImport(from: string, spec: string): string | null {
	let base: string;
	if (spec.startsWith('$lib/') || spec === '$lib') base = join(src, 'lib', spec.slice(5));
	else if (spec.startsWith('.')) base = resolve(dirname(from), spec);
	else return null;
	for (const c of [base, `${base}.ts`, `${base}.js`, join(base, 'index.ts')])
		if (existsSync(c) && statSync(c).isFile()) return c;
	return null;
}

/** Imports that run (type-only imports vanish at build time and make no circle). */
function runtimeImports(file: string): string[] {
	const text = readFileSync(file, 'utf8');
	const out: string[] = [];
	const re =
		/(?:^|\n)\s*(import|export)\s+(type\s+)?([^'"]*?)\s*from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;
	for (const m of text.matchAll(re)) {
		const spec = m[4] ?? m[5];
		if (m[2]) continue;
		// `import { type A, type B } from` is type-only too.
		const names = m[3] ?? '';
		if (
			/^\{[^}]*\}$/.test(names.trim()) &&
			names
				.replace(/[{}\s]/g, '')
				.split(',')
				.filter(Boolean)
				.every((n) => n.startsWith('type'))
		)
			continue;
		const target = resolveImport(file, spec);
		if (target) out.push(target);
	}
	return out;
}

describe('the house rules of src', () => {
	it('has no import circle', () => {
		const graph = new Map(files.map((f) => [f, runtimeImports(f)]));
		const state = new Map<string, 'open' | 'done'>();
		const circles: string[] = [];
		const stack: string[] = [];
		const visit = (f: string): void => {
			state.set(f, 'open');
			stack.push(f);
			for (const t of graph.get(f) ?? []) {
				if (state.get(t) === 'open') circles.push([...stack.slice(stack.indexOf(t)), t].map(rel).join(' -> '));
				else if (!state.has(t)) visit(t);
			}
			stack.pop();
			state.set(f, 'done');
		};
		for (const f of files) if (!state.has(f)) visit(f);
		expect(circles).toEqual([]);
	});

	it('keeps src/lib/server out of src/lib/components', () => {
		const server = files.filter((f) => rel(f).startsWith('src/lib/server/'));
		const wrong = server.flatMap((f) => {
			const text = readFileSync(f, 'utf8');
			return /from\s+['"](\$lib\/components|(\.\.\/)+components)/.test(text) ? [rel(f)] : [];
		});
		expect(wrong).toEqual([]);
	});

	it('has no source file over 400 lines but data', () => {
		// Data, not logic: the starter library of crops and varieties.
		const data = new Set(['src/lib/server/starter-library.ts']);
		const long = files
			.map((f) => ({ f: rel(f), n: readFileSync(f, 'utf8').split('\n').length - 1 }))
			.filter((x) => x.n > 400 && !data.has(x.f));
		expect(long).toEqual([]);
	});

	it('types database rows instead of any', () => {
		const found = files.flatMap((f) =>
			readFileSync(f, 'utf8')
				.split('\n')
				.map((line, i) => ({ line, at: `${rel(f)}:${i + 1}` }))
				.filter(({ line }) => /\bas any\b|:\s*any\b|<any>/.test(line) && !line.trim().startsWith('//'))
				.map(({ at }) => at)
		);
		expect(found).toEqual([]);
	});
});
