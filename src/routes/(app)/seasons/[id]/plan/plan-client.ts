// The plan screen's requests: the options as the plan API takes them, and the answers.
import type { PreviewDetails } from '$lib/server/plan-screen';
import type { PreviewCover } from '$lib/server/plan-cover';
import type { LastApply } from '$lib/server/plan-history';

export interface ShareDraft {
	varietyId: number;
	fromWeek: number | null;
	toWeek: number | null;
	/** Percent of the crop's target in those weeks; null for "all of it". */
	percent: number | null;
}

export interface OptionsDraft {
	intervalWeeks: number | null;
	/** Extra grown over the target, in percent. */
	marginPercent: number | null;
	/** Crops planned with chosen varieties, by crop id; others use their first variety. */
	splits: Record<string, ShareDraft[]>;
}

export interface PlanRequestBody {
	intervalWeeks?: number;
	margin?: number;
	varietyPlan?: Record<string, { varietyId: number; fromWeek?: number; toWeek?: number; fraction?: number }[]>;
}

export function requestOf(d: OptionsDraft): PlanRequestBody {
	const body: PlanRequestBody = {};
	if (d.intervalWeeks !== null) body.intervalWeeks = d.intervalWeeks;
	if (d.marginPercent !== null) body.margin = Math.round(d.marginPercent * 100) / 10_000;
	const plan = Object.entries(d.splits).filter(([, shares]) => shares.length > 0);
	if (plan.length) {
		body.varietyPlan = Object.fromEntries(
			plan.map(([crop, shares]) => [
				crop,
				shares.map((s) => ({
					varietyId: s.varietyId,
					...(s.fromWeek !== null ? { fromWeek: s.fromWeek } : {}),
					...(s.toWeek !== null ? { toWeek: s.toWeek } : {}),
					...(s.percent !== null ? { fraction: Math.round(s.percent * 100) / 10_000 } : {})
				}))
			])
		);
	}
	return body;
}

/** The options of a past apply as a draft, so the screen reopens on what was last applied. */
export function draftOf(options: unknown): OptionsDraft {
	const o = (options ?? {}) as PlanRequestBody;
	return {
		intervalWeeks: typeof o.intervalWeeks === 'number' ? o.intervalWeeks : null,
		marginPercent: typeof o.margin === 'number' ? Math.round(o.margin * 10_000) / 100 : null,
		splits: Object.fromEntries(
			Object.entries(o.varietyPlan ?? {}).map(([crop, shares]) => [
				crop,
				shares.map((s) => ({
					varietyId: s.varietyId,
					fromWeek: s.fromWeek ?? null,
					toWeek: s.toWeek ?? null,
					percent: s.fraction === undefined ? null : Math.round(s.fraction * 10_000) / 100
				}))
			])
		)
	};
}

export interface PreviewAnswer {
	fingerprint: string;
	kept: number;
	replaced: number;
	shortfall: { crop: string; week: string; quantity: number }[];
	warnings: { code: string; message: string; cropId?: string; key?: string; weeks?: string[] }[];
	names: { crops: Record<string, string>; varieties: Record<string, string>; beds: Record<string, string> };
	changes: PreviewDetails;
	cover: Omit<PreviewCover, 'balance'>;
	/** The proposed plantings, in the order the cover's `n{index}` keys count them. */
	plantings: { varietyId: string; bedId: string | null; startFt: number; fieldDate: string }[];
}

export interface PlanState {
	fingerprint: string;
	planAppliedAt: string | null;
	demandChangedAt: string | null;
	demandChangedSincePlan: boolean;
	lastApply: LastApply | null;
}

/** POSTs JSON; answers the parsed body with the status, a network failure as status 0. */
export async function send<T>(
	url: string,
	body?: unknown
): Promise<{ status: number; body: T & { message?: string } }> {
	try {
		const res = await fetch(url, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: body === undefined ? undefined : JSON.stringify(body)
		});
		const parsed = await res.json().catch(() => ({ message: `The server answered ${res.status}.` }));
		return { status: res.status, body: parsed };
	} catch {
		return {
			status: 0,
			body: { message: 'No answer from the server: check the connection and try again.' } as T & { message: string }
		};
	}
}
