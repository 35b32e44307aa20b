// The access table: one row per server entry point (page, form action, API method) with the
// status each kind of visitor must get. tests/integration/access.test.ts lists every entry from
// src/routes and fails for any without a row here, then probes every row against the test app.
//
// Adding a route: add a row with its key exactly as the failure message prints it, a `url` built
// from the fixture's ids, and the expected status per visitor:
//   anon  - no session                    owner - the demo farm's owner
//   crew  - the demo farm's crew lead     share - the demo farm's share manager
//   other - another farm's owner, using the demo farm's ids (must be 404, or the other farm's own page)
// A status may be a list when more than one answer is right (say so in `why`).
// Probes send no body (forms) or `{}` (JSON) unless the row gives one, so a writing route answers
// 400 to the roles allowed in: that is the sign that the role check let them through and nothing
// was written. A row whose empty request would still change data (delete, copy, apply) builds its
// ids per probe from `fresh` throwaway rows of the fixture's scratch season.
import type { AccessFixture } from './access-fixture';

export type Who = 'anon' | 'owner' | 'crew' | 'share' | 'other';
export type Status = number | number[];
export interface AccessRow {
	key: string;
	url: (f: AccessFixture, who: Who) => string | Promise<string>;
	expect: Record<Who, Status>;
	/** JSON body for API methods (default {}), or form fields for actions (default none). */
	body?: Record<string, unknown>;
	/** Sign in afresh for this probe (signing out ends the session). */
	freshSession?: boolean;
	why?: string;
}

// Shorthands for the usual patterns.
const S = (f: AccessFixture) => f.seasonId;
/** A page every member opens; another farm's owner gets 404 for the demo farm's ids. */
const everyMemberSeasonPage = { anon: 303, owner: 200, crew: 200, share: 200, other: 404 };
/** A page for any signed-in member that shows the viewer's own farm (no ids in the URL). */
const ownFarmPage = { anon: 303, owner: 200, crew: 200, share: 200, other: 200 };
const ownerOnlyPage = { anon: 303, owner: 200, crew: 403, share: 403, other: 200 };
const everyMemberApi = { anon: 401, owner: 200, crew: 200, share: 200, other: 404 };
/** Writing form actions: allowed roles get 400 for the empty form, others 403, other farms 404. */
const action = (allowed: Who[], okStatus = 400) => ({
	anon: 303,
	owner: allowed.includes('owner') ? okStatus : 403,
	crew: allowed.includes('crew') ? okStatus : 403,
	share: allowed.includes('share') ? okStatus : 403,
	other: allowed.includes('other') ? okStatus : 404
});
const api = (allowed: Who[], okStatus = 400) => ({ ...action(allowed, okStatus), anon: 401 });
/** Public sign-in pages: open to all; a signed-in visitor is sent on to the app. */
const all = (status: number) => ({ anon: status, owner: status, crew: status, share: status, other: status });
const authPage = { anon: 200, owner: 303, crew: 303, share: 303, other: 303 };

export const accessTable: AccessRow[] = [
	// Pages of the signed-in app
	{ key: '(app) page', url: () => '/', expect: ownFarmPage },
	{ key: '(app)/calendar page', url: () => '/calendar', expect: ownFarmPage },
	{
		key: '(app)/calendar action:create',
		url: () => '/calendar?/create',
		expect: { anon: 303, owner: 200, crew: 200, share: 200, other: 200 },
		why: "each member's own feed"
	},
	{
		key: '(app)/calendar action:seasons',
		url: () => '/calendar?/seasons',
		expect: { anon: 303, owner: 400, crew: 400, share: 400, other: 400 },
		why: "each member's own feed; an empty choice is a 400"
	},
	{
		key: '(app)/calendar action:revoke',
		url: () => '/calendar?/revoke',
		expect: all(303),
		why: "each member's own feed"
	},
	{ key: '(app)/crops page', url: () => '/crops', expect: ownFarmPage },
	{ key: '(app)/crops/new page', url: () => '/crops/new', expect: ownerOnlyPage },
	{
		key: '(app)/crops/new action:default',
		url: () => '/crops/new',
		expect: { ...action(['owner']), other: 400 },
		why: "adds to the viewer's own library"
	},
	{ key: '(app)/crops/[cropId] page', url: (f) => `/crops/${f.cropId}`, expect: everyMemberSeasonPage },
	{ key: '(app)/crops/[cropId] action:save', url: (f) => `/crops/${f.cropId}?/save`, expect: action(['owner']) },
	{
		key: '(app)/crops/[cropId] action:archive',
		url: async (f) => `/crops/${await f.freshCrop()}?/archive`,
		expect: action(['owner'], 303)
	},
	{
		key: '(app)/crops/[cropId] action:restore',
		url: async (f) => `/crops/${await f.freshCrop()}?/restore`,
		expect: action(['owner'], 303)
	},
	{
		key: '(app)/crops/[cropId]/varieties/new page',
		url: (f) => `/crops/${f.cropId}/varieties/new`,
		expect: { ...ownerOnlyPage, other: 404 }
	},
	{
		key: '(app)/crops/[cropId]/varieties/new action:default',
		url: (f) => `/crops/${f.cropId}/varieties/new`,
		expect: action(['owner'])
	},
	{
		key: '(app)/crops/[cropId]/varieties/[varietyId] page',
		url: (f) => `/crops/${f.cropId}/varieties/${f.varietyId}`,
		expect: everyMemberSeasonPage
	},
	{
		key: '(app)/crops/[cropId]/varieties/[varietyId] action:save',
		url: (f) => `/crops/${f.cropId}/varieties/${f.varietyId}?/save`,
		expect: action(['owner'])
	},
	...(['archive', 'restore', 'delete'] as const).map((name) => ({
		key: `(app)/crops/[cropId]/varieties/[varietyId] action:${name}`,
		url: async (f: AccessFixture) => {
			const v = await f.freshVariety();
			return `/crops/${v.cropId}/varieties/${v.varietyId}?/${name}`;
		},
		expect: action(['owner'], 303)
	})),
	{
		key: '(app)/dev/mail page',
		url: () => '/dev/mail',
		expect: ownerOnlyPage,
		why: 'demo mode only; lists the viewer farm’s own mail'
	},
	{ key: '(app)/import page', url: () => '/import', expect: ownerOnlyPage },
	{
		key: '(app)/import action:apply',
		url: () => '/import?/apply',
		expect: { ...action(['owner']), other: 400 },
		why: 'no preview token: 400'
	},
	{
		key: '(app)/import action:import',
		url: () => '/import?/import',
		expect: { ...action(['owner'], 415), other: 415 },
		why: 'not a file upload: 415; the season is checked with the file'
	},
	{ key: '(app)/seasons page', url: () => '/seasons', expect: ownFarmPage },
	{
		key: '(app)/seasons action:create',
		url: () => '/seasons?/create',
		expect: { ...action(['owner']), other: 400 },
		why: "a season of the viewer's own farm"
	},
	{
		key: '(app)/seasons action:copy',
		url: () => '/seasons?/copy',
		expect: { ...action(['owner']), other: 400 },
		why: 'no season named: 400 at its field'
	},
	{
		key: '(app)/seasons action:rename',
		url: () => '/seasons?/rename',
		body: {},
		expect: action(['owner'], 404),
		why: 'no season named: not found'
	},
	{
		key: '(app)/seasons action:archive',
		url: () => '/seasons?/archive',
		expect: action(['owner'], 404),
		why: 'no season named: not found'
	},
	{
		key: '(app)/seasons action:restore',
		url: () => '/seasons?/restore',
		expect: action(['owner'], 404),
		why: 'no season named: not found'
	},
	{ key: '(app)/setup page', url: () => '/setup', expect: ownerOnlyPage },
	{
		key: '(app)/setup action:default',
		url: () => '/setup',
		expect: { ...action(['owner']), other: 400 },
		why: "the viewer's own farm"
	},
	{ key: '(app)/setup/beds page', url: () => '/setup/beds', expect: ownerOnlyPage },
	{ key: '(app)/setup/beds action:default', url: () => '/setup/beds', expect: { ...action(['owner']), other: 400 } },
	{ key: '(app)/setup/crops page', url: () => '/setup/crops', expect: ownerOnlyPage },
	{ key: '(app)/setup/crops action:default', url: () => '/setup/crops', expect: { ...action(['owner']), other: 400 } },
	{ key: '(app)/setup/season page', url: () => '/setup/season', expect: ownerOnlyPage },
	{
		key: '(app)/setup/season action:default',
		url: () => '/setup/season',
		expect: { ...action(['owner']), other: 400 }
	},
	{ key: '(app)/settings page', url: () => '/settings', expect: ownerOnlyPage },
	{
		key: '(app)/settings action:farm',
		url: () => '/settings?/farm',
		expect: { ...action(['owner']), other: 400 },
		why: "the farm is the viewer's own"
	},
	{
		key: '(app)/settings action:addBlock',
		url: () => '/settings?/addBlock',
		expect: { ...action(['owner']), other: 400 }
	},
	{
		key: '(app)/settings action:saveBed',
		url: () => '/settings?/saveBed',
		body: { id: 0 },
		expect: { ...action(['owner']), other: 400 }
	},
	{
		key: '(app)/settings action:bulkBeds',
		url: () => '/settings?/bulkBeds',
		expect: { ...action(['owner']), other: 400 }
	},
	{
		key: '(app)/settings action:deleteBed',
		url: () => '/settings?/deleteBed',
		body: { id: '' },
		expect: { ...action(['owner'], 404), other: 404 }
	},
	{ key: '(app)/team page', url: () => '/team', expect: ownerOnlyPage },
	{ key: '(app)/team action:invite', url: () => '/team?/invite', expect: { ...action(['owner']), other: 400 } },
	{
		key: '(app)/team action:revoke',
		url: () => '/team?/revoke',
		expect: { ...action(['owner']), other: 400 },
		why: 'no invite named: 400 naming id'
	},
	{
		key: '(app)/team action:resend',
		url: () => '/team?/resend',
		expect: { ...action(['owner']), other: 400 },
		why: 'no invite named: 400 naming id'
	},
	{
		key: '(app)/team action:role',
		url: () => '/team?/role',
		expect: { ...action(['owner']), other: 400 },
		why: "no member named: 400; another farm's owner acts on their own team"
	},
	{
		key: '(app)/team action:remove',
		url: () => '/team?/remove',
		expect: { ...action(['owner']), other: 400 },
		why: "no member named: 400; another farm's owner acts on their own team"
	},

	// One season
	{ key: '(app)/seasons/[id] page', url: (f) => `/seasons/${S(f)}`, expect: everyMemberSeasonPage },
	{ key: '(app)/seasons/[id]/beds page', url: (f) => `/seasons/${S(f)}/beds`, expect: everyMemberSeasonPage },
	{ key: '(app)/seasons/[id]/boxes page', url: (f) => `/seasons/${S(f)}/boxes`, expect: everyMemberSeasonPage },
	{
		key: '(app)/seasons/[id]/boxes action:swap',
		url: (f) => `/seasons/${S(f)}/boxes?/swap`,
		expect: action(['owner', 'share'])
	},
	{
		key: '(app)/seasons/[id]/boxes action:shortFill',
		url: (f) => `/seasons/${S(f)}/boxes?/shortFill`,
		expect: action(['owner', 'share'])
	},
	{
		key: '(app)/seasons/[id]/boxes action:undo',
		url: (f) => `/seasons/${S(f)}/boxes?/undo`,
		expect: action(['owner', 'share'])
	},
	{ key: '(app)/seasons/[id]/demand page', url: (f) => `/seasons/${S(f)}/demand`, expect: everyMemberSeasonPage },
	{
		key: '(app)/seasons/[id]/demand action:addShare',
		url: (f) => `/seasons/${S(f)}/demand?/addShare`,
		expect: action(['owner', 'share'])
	},
	{
		key: '(app)/seasons/[id]/demand action:saveShare',
		url: (f) => `/seasons/${S(f)}/demand?/saveShare`,
		expect: action(['owner', 'share'])
	},
	{
		key: '(app)/seasons/[id]/demand action:deleteShare',
		url: (f) => `/seasons/${S(f)}/demand?/deleteShare`,
		expect: action(['owner', 'share'], 404)
	},
	{
		key: '(app)/seasons/[id]/demand action:saveGrid',
		url: (f) => `/seasons/${S(f)}/demand?/saveGrid`,
		expect: action(['owner', 'share'])
	},
	{
		key: '(app)/seasons/[id]/demand action:copyWeek',
		url: (f) => `/seasons/${S(f)}/demand?/copyWeek`,
		expect: action(['owner', 'share'])
	},
	{
		key: '(app)/seasons/[id]/demand action:upload',
		url: (f) => `/seasons/${S(f)}/demand?/upload`,
		expect: action(['owner', 'share'])
	},
	{ key: '(app)/seasons/[id]/plan page', url: (f) => `/seasons/${S(f)}/plan`, expect: everyMemberSeasonPage },
	{ key: '(app)/seasons/[id]/seeds page', url: (f) => `/seasons/${S(f)}/seeds`, expect: everyMemberSeasonPage },
	{
		key: '(app)/seasons/[id]/seeds/seed-order.csv GET',
		url: (f) => `/seasons/${S(f)}/seeds/seed-order.csv`,
		expect: everyMemberSeasonPage
	},
	{ key: '(app)/seasons/[id]/forecast page', url: (f) => `/seasons/${S(f)}/forecast`, expect: everyMemberSeasonPage },
	{ key: '(app)/seasons/[id]/harvests page', url: (f) => `/seasons/${S(f)}/harvests`, expect: everyMemberSeasonPage },
	{
		key: '(app)/seasons/[id]/harvests action:log',
		url: (f) => `/seasons/${S(f)}/harvests?/log`,
		expect: action(['owner', 'crew'])
	},
	{
		key: '(app)/seasons/[id]/harvests action:sheet',
		url: (f) => `/seasons/${S(f)}/harvests?/sheet`,
		expect: action(['owner', 'crew'], 303),
		why: 'an empty sheet saves no rows'
	},
	{
		key: '(app)/seasons/[id]/harvests action:edit',
		url: (f) => `/seasons/${S(f)}/harvests?/edit`,
		expect: action(['owner', 'crew'])
	},
	{
		key: '(app)/seasons/[id]/harvests action:delete',
		url: (f) => `/seasons/${S(f)}/harvests?/delete`,
		expect: action(['owner', 'crew'], 404)
	},
	{ key: '(app)/seasons/[id]/plantings page', url: (f) => `/seasons/${S(f)}/plantings`, expect: everyMemberSeasonPage },
	{ key: '(app)/seasons/[id]/results page', url: (f) => `/seasons/${S(f)}/results`, expect: everyMemberSeasonPage },
	{
		key: '(app)/seasons/[id]/results action:useFigures',
		url: (f) => `/seasons/${S(f)}/results?/useFigures`,
		expect: action(['owner'])
	},
	{
		key: '(app)/seasons/[id]/results action:undoFigures',
		url: (f) => `/seasons/${S(f)}/results?/undoFigures`,
		expect: action(['owner'])
	},
	{
		key: '(app)/seasons/[id]/results action:copySeason',
		url: async (f, who) => `/seasons/${who === 'owner' ? await f.freshSeason() : S(f)}/results?/copySeason`,
		expect: action(['owner'], 200),
		why: 'copies a throwaway season for the owner'
	},
	{ key: '(app)/seasons/[id]/transfer page', url: (f) => `/seasons/${S(f)}/transfer`, expect: everyMemberSeasonPage },
	{
		key: '(app)/seasons/[id]/transfer action:apply',
		url: (f) => `/seasons/${S(f)}/transfer?/apply`,
		expect: action(['owner']),
		why: 'no preview token: 400'
	},
	{
		key: '(app)/seasons/[id]/transfer action:import',
		url: (f) => `/seasons/${S(f)}/transfer?/import`,
		expect: action(['owner'], 415)
	},
	{
		key: '(app)/seasons/[id]/week page',
		url: (f) => `/seasons/${S(f)}/week`,
		expect: { ...everyMemberSeasonPage, owner: 307, crew: 307, share: 307 },
		why: "redirects to this week's sheets"
	},
	{
		key: '(app)/seasons/[id]/week/[isoWeek] page',
		url: (f) => `/seasons/${S(f)}/week/2027-W21`,
		expect: everyMemberSeasonPage
	},
	{
		key: '(app)/seasons/[id]/week/[isoWeek] action:done',
		url: (f) => `/seasons/${S(f)}/week/2027-W21?/done`,
		expect: action(['owner', 'crew'])
	},
	{
		key: '(app)/seasons/[id]/week/[isoWeek] action:undo',
		url: (f) => `/seasons/${S(f)}/week/2027-W21?/undo`,
		expect: action(['owner', 'crew']),
		why: 'no tick named: 400'
	},
	{
		key: '(app)/seasons/[id]/week/[isoWeek] action:email',
		url: (f) => `/seasons/${S(f)}/week/2027-W21?/email`,
		expect: action(['owner', 'crew'])
	},
	{
		key: '(app)/seasons/[id]/week/[isoWeek]/sheets.xlsx GET',
		url: (f) => `/seasons/${S(f)}/week/2027-W21/sheets.xlsx`,
		expect: everyMemberSeasonPage
	},

	// Sign-in pages (no session needed)
	{ key: '(auth)/forgot page', url: () => '/forgot', expect: all(200) },
	{ key: '(auth)/forgot action:default', url: () => '/forgot', expect: all(400) },
	{
		key: '(auth)/invite/[token] page',
		url: () => '/invite/not-a-real-token',
		expect: all(200),
		why: 'says the link is not valid'
	},
	{ key: '(auth)/invite/[token] action:default', url: () => '/invite/not-a-real-token', expect: all(400) },
	{
		key: '(auth)/reset/[token] page',
		url: () => '/reset/not-a-real-token',
		expect: all(200),
		why: 'says the link is not valid'
	},
	{ key: '(auth)/reset/[token] action:default', url: () => '/reset/not-a-real-token', expect: all(400) },
	{ key: '(auth)/signin page', url: () => '/signin', expect: authPage },
	{
		key: '(auth)/signin action:default',
		url: () => '/signin',
		expect: { ...all(303), anon: 400 },
		why: 'a signed-in visitor is sent on'
	},
	{ key: '(auth)/signup page', url: () => '/signup', expect: authPage },
	{
		key: '(auth)/signup action:default',
		url: () => '/signup',
		expect: { ...all(303), anon: 400 },
		why: 'a signed-in visitor is sent on'
	},
	{
		key: '(auth)/signup/confirm/[token] page',
		url: () => '/signup/confirm/not-a-real-token',
		expect: all(200),
		why: 'says the link has expired or was used'
	},
	{
		key: '(auth)/signup/confirm/[token] action:default',
		url: () => '/signup/confirm/not-a-real-token',
		expect: all(400),
		why: 'no such sign-up: nothing is made'
	},
	{
		key: '(auth)/signup/mail page',
		url: () => '/signup/mail',
		expect: all(200),
		why: "demo mode only (the tests run in it); shows only the browser's own sign-up mail"
	},
	{ key: 'signout page', url: () => '/signout', expect: all(303) },
	{ key: 'signout action:default', url: () => '/signout', freshSession: true, expect: all(303) },
	{ key: 'calendar/[token].ics GET', url: () => '/calendar/not-a-real-token.ics', expect: all(404) },

	// JSON API
	{
		key: 'api/import POST',
		url: () => '/api/import',
		expect: { ...api(['owner'], 415), other: 415 },
		why: 'not a file upload: 415; the season is checked with the file'
	},
	{
		key: 'api/import/apply POST',
		url: () => '/api/import/apply',
		expect: { ...api(['owner']), other: 400 },
		why: 'no preview token: 400; a token is only ever its own farm and user'
	},
	{ key: 'api/me GET', url: () => '/api/me', expect: { anon: 401, owner: 200, crew: 200, share: 200, other: 200 } },
	{
		key: 'api/me/prefs/grid GET',
		url: () => '/api/me/prefs/grid',
		expect: { anon: 401, owner: 200, crew: 200, share: 200, other: 200 }
	},
	{
		key: 'api/me/prefs/grid PUT',
		url: () => '/api/me/prefs/grid',
		expect: { anon: 401, owner: 400, crew: 400, share: 400, other: 400 }
	},
	{
		key: 'api/plantings/[id] PATCH',
		url: (f) => `/api/plantings/${f.plantingId}`,
		body: { version: 999_999 },
		expect: api(['owner', 'crew'], 409),
		why: 'a stale version: refused with the current row, nothing written'
	},
	{
		key: 'api/plantings/[id] DELETE',
		url: async (f) => `/api/plantings/${await f.freshPlanting()}`,
		expect: api(['owner'], 204),
		why: 'a throwaway planting per probe'
	},
	{ key: 'api/plantings/[id]/cover GET', url: (f) => `/api/plantings/${f.plantingId}/cover`, expect: everyMemberApi },
	{ key: 'api/seasons/[id]/boxes GET', url: (f) => `/api/seasons/${S(f)}/boxes`, expect: everyMemberApi },
	{
		key: 'api/seasons/[id]/boxes/swaps POST',
		url: (f) => `/api/seasons/${S(f)}/boxes/swaps`,
		expect: api(['owner', 'share'])
	},
	{
		key: 'api/seasons/[id]/boxes/swaps/[swapId] DELETE',
		url: async (f) => `/api/seasons/${f.scratchSeasonId}/boxes/swaps/${await f.freshSwap()}`,
		expect: api(['owner', 'share'], 204),
		why: 'undoes a throwaway swap per probe'
	},
	{
		key: 'api/seasons/[id]/copy POST',
		url: async (f, who) => `/api/seasons/${who === 'owner' ? await f.freshSeason() : S(f)}/copy`,
		expect: api(['owner'], 201),
		why: 'copies a throwaway season for the owner'
	},
	{ key: 'api/seasons/[id]/demand GET', url: (f) => `/api/seasons/${S(f)}/demand`, expect: everyMemberApi },
	{
		key: 'api/seasons/[id]/demand/cells PATCH',
		url: (f) => `/api/seasons/${S(f)}/demand/cells`,
		expect: api(['owner', 'share'])
	},
	{
		key: 'api/seasons/[id]/demand/copy-week POST',
		url: (f) => `/api/seasons/${S(f)}/demand/copy-week`,
		expect: api(['owner', 'share'])
	},
	{
		key: 'api/seasons/[id]/demand/file GET',
		url: (f) => `/api/seasons/${S(f)}/demand/file?format=csv`,
		expect: everyMemberApi
	},
	{
		key: 'api/seasons/[id]/demand/share-sizes GET',
		url: (f) => `/api/seasons/${S(f)}/demand/share-sizes`,
		expect: everyMemberApi
	},
	{
		key: 'api/seasons/[id]/demand/share-sizes POST',
		url: (f) => `/api/seasons/${S(f)}/demand/share-sizes`,
		expect: api(['owner', 'share'])
	},
	{
		key: 'api/seasons/[id]/demand/share-sizes/[shareId] PUT',
		url: (f) => `/api/seasons/${S(f)}/demand/share-sizes/${f.shareSizeId}`,
		expect: api(['owner', 'share'])
	},
	{
		key: 'api/seasons/[id]/demand/share-sizes/[shareId] DELETE',
		url: async (f) => `/api/seasons/${f.scratchSeasonId}/demand/share-sizes/${await f.freshShareSize()}`,
		expect: api(['owner', 'share'], 204),
		why: 'a throwaway share size per probe'
	},
	{
		key: 'api/seasons/[id]/demand/upload POST',
		url: (f) => `/api/seasons/${S(f)}/demand/upload`,
		expect: api(['owner', 'share'])
	},
	{ key: 'api/seasons/[id]/export GET', url: (f) => `/api/seasons/${S(f)}/export`, expect: everyMemberApi },
	{ key: 'api/seasons/[id]/forecast GET', url: (f) => `/api/seasons/${S(f)}/forecast`, expect: everyMemberApi },
	{
		key: 'api/seasons/[id]/free-space GET',
		url: (f) => `/api/seasons/${S(f)}/free-space?from=2027-W20&to=2027-W23`,
		expect: everyMemberApi
	},
	{ key: 'api/seasons/[id]/harvests GET', url: (f) => `/api/seasons/${S(f)}/harvests`, expect: everyMemberApi },
	{
		key: 'api/seasons/[id]/harvests POST',
		url: (f) => `/api/seasons/${S(f)}/harvests`,
		expect: api(['owner', 'crew'])
	},
	{
		key: 'api/seasons/[id]/harvests/[harvestId] GET',
		url: (f) => `/api/seasons/${f.harvestSeasonId}/harvests/${f.harvestId}`,
		expect: everyMemberApi
	},
	{
		key: 'api/seasons/[id]/harvests/[harvestId] PATCH',
		url: (f) => `/api/seasons/${f.harvestSeasonId}/harvests/${f.harvestId}`,
		expect: api(['owner', 'crew'])
	},
	{
		key: 'api/seasons/[id]/harvests/[harvestId] DELETE',
		url: async (f) => `/api/seasons/${f.scratchSeasonId}/harvests/${await f.freshHarvest()}`,
		expect: api(['owner', 'crew'], 204),
		why: 'a throwaway harvest record per probe'
	},
	{
		key: 'api/seasons/[id]/harvests/audit GET',
		url: (f) => `/api/seasons/${S(f)}/harvests/audit`,
		expect: everyMemberApi
	},
	{
		key: 'api/seasons/[id]/harvests/results GET',
		url: (f) => `/api/seasons/${S(f)}/harvests/results`,
		expect: everyMemberApi
	},
	{
		key: 'api/seasons/[id]/plan/apply POST',
		url: (f, who) => `/api/seasons/${who === 'owner' ? f.scratchSeasonId : S(f)}/plan/apply`,
		expect: api(['owner'], 200),
		why: 'applies to the empty scratch season for the owner'
	},
	{ key: 'api/seasons/[id]/plan GET', url: (f) => `/api/seasons/${S(f)}/plan`, expect: everyMemberApi },
	{
		key: 'api/seasons/[id]/plan/undo POST',
		url: (f, who) => `/api/seasons/${who === 'owner' ? f.scratchSeasonId : S(f)}/plan/undo`,
		expect: { ...api(['owner'], 200), owner: [200, 409] },
		why: "the owner undoes on the scratch season: 200 after the apply row's apply, 409 when there is nothing to undo"
	},
	{
		key: 'api/seasons/[id]/plan/preview POST',
		url: (f) => `/api/seasons/${S(f)}/plan/preview`,
		expect: api(['owner'], 200)
	},
	{ key: 'api/seasons/[id]/plantings GET', url: (f) => `/api/seasons/${S(f)}/plantings`, expect: everyMemberApi },
	{ key: 'api/seasons/[id]/plantings POST', url: (f) => `/api/seasons/${S(f)}/plantings`, expect: api(['owner']) }
];
