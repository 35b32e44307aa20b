// Told on window after something wrote to the season's plan (a grid save, a plan applied or undone),
// so the views that show the plan's figures (the forecast) fetch them again.
export const PLAN_CHANGED_EVENT = 'furrowcast:plan-changed';

export function announcePlanChanged(): void {
	if (typeof window !== 'undefined') window.dispatchEvent(new Event(PLAN_CHANGED_EVENT));
}
