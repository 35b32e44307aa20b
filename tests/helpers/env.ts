// Settings of the test run, as scripts/test.sh exports them.
export function baseUrl(): string {
	const url = process.env.FC_BASE_URL;
	if (!url) throw new Error('FC_BASE_URL is not set: run the tests with npm test');
	return url;
}

export const demo = {
	password: 'demo-harvest-2027',
	owner: 'owner@demo.furrowcast.test',
	crew: 'crew@demo.furrowcast.test',
	share: 'share@demo.furrowcast.test'
} as const;
