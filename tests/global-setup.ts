// Integration tests write to the database: refuse anything but a test database.
export default function setup() {
	const url = process.env.DATABASE_URL;
	if (url && !/_test(\?|$)/.test(new URL(url).pathname + (new URL(url).search ? '?' : ''))) {
		throw new Error(`DATABASE_URL must name a *_test database for tests, got ${new URL(url).pathname}`);
	}
}
