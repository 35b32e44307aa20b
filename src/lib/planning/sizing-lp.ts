// The plan's sizing as a linear program, for comparing a plan with its lower bound (bench, tests).
import { type SizingProblem, planRuns } from './sizing';
import type { PlanInput } from './succession-types';

/**
 * The plan's sizing as a linear program, for comparing the plan with its lower bound: one
 * variable per reachable candidate start (bed-feet, continuous), minimising bed-foot-days
 * (bed-feet × days from field date to the end of the window), with every week a reachable
 * start can supply getting at least its target × (1 + margin), less what is supplied from
 * outside the plan. Returned as CPLEX LP text for any LP solver (the bench and tests use the
 * `highs` package), beside the plan's own bed-foot-days on the same measure. `lpWhole` is the
 * same program with bed-feet in whole bed-foot increments (an integer program): a plan must
 * round to increments, so its optimum is the tightest bound such a plan can meet.
 */
export function sizingLp(input: PlanInput): {
	lp: string;
	lpWhole: string;
	planBedFootDays: number;
	variables: number;
} {
	let problem: SizingProblem | undefined;
	const plan = planRuns(
		input,
		undefined,
		false,
		(run) => ({ last: run.lastHarvest, feet: run.bedFeet, field: run.fieldDay }),
		(p) => (problem = p)
	);
	let planBedFootDays = 0;
	// The same measure as each candidate's occupancy: field date to the end of its (possibly shortened) harvest.
	for (const r of plan.items) planBedFootDays += r.feet * (r.last + 1 - r.field);
	const p = problem;
	if (!p) return { lp: '', lpWhole: '', planBedFootDays, variables: 0 };
	const inc = input.options?.bedFootIncrement ?? 1;
	const program = (scale: number): { rows: string[]; obj: string[]; names: string[] } => {
		const obj: string[] = [];
		const rows: string[] = [];
		const used = new Set<number>();
		for (let w = 0; w < p.nWeeks; w++) {
			if (!(p.target[w] > 0) || !(p.need[w] > 0)) continue;
			const terms: string[] = [];
			for (let c = w; c >= Math.max(p.cMin, w - p.span + 1); c--) {
				if (p.step > 1 && ((c % p.step) + p.step) % p.step !== 0) continue;
				// The candidate first: working it out sets its per-foot supply (a late or frost-cut harvest).
				if (!p.candidate(c).ok) continue;
				const cf = p.perFt(c, w);
				if (!(cf > 0)) continue;
				terms.push(`${cf * scale} x${c - p.cMin}`);
				used.add(c);
			}
			if (terms.length > 0) rows.push(` w${w}: ${terms.join(' + ')} >= ${p.need[w]}`);
		}
		const names: string[] = [];
		for (const c of [...used].sort((a, b) => a - b)) {
			obj.push(`${p.candidate(c).occupancy * scale} x${c - p.cMin}`);
			names.push(`x${c - p.cMin}`);
		}
		return { rows, obj, names };
	};
	const text = (q: ReturnType<typeof program>, general: boolean): string =>
		`Minimize\n obj: ${q.obj.join(' + ')}\nSubject To\n${q.rows.join('\n')}\n` +
		(general ? `General\n ${q.names.join(' ')}\n` : '') +
		'End\n';
	const feet = program(1);
	if (feet.rows.length === 0) return { lp: '', lpWhole: '', planBedFootDays, variables: 0 };
	return { lp: text(feet, false), lpWhole: text(program(inc), true), planBedFootDays, variables: feet.names.length };
}
