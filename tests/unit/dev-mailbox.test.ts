import { describe, expect, it } from 'vitest';
import { devMailboxUrl, listensOnLoopback } from '$lib/server/dev-mailbox';

const reader = 'http://127.0.0.1:2626';

describe('the dev mailbox is served only on loopback with the local stand-in', () => {
	it('is on for each loopback HOST when the stand-in reader is set', () => {
		for (const HOST of ['127.0.0.1', '::1', '[::1]', 'localhost', 'LOCALHOST']) {
			expect(listensOnLoopback({ HOST })).toBe(true);
			expect(devMailboxUrl({ HOST, MAILBOX_URL: reader })).toBe(reader);
		}
	});

	it('is off when the app listens beyond this machine', () => {
		// adapter-node listens on every interface when HOST is unset.
		for (const HOST of [undefined, '', '0.0.0.0', '::', '192.168.1.20', '127.0.0.1.example.test', 'localhost.example.test']) {
			expect(listensOnLoopback({ HOST })).toBe(false);
			expect(devMailboxUrl({ HOST, MAILBOX_URL: reader })).toBeNull();
		}
		expect(devMailboxUrl({ HOST: '127.0.0.1', SOCKET_PATH: '/run/app.sock', MAILBOX_URL: reader })).toBeNull();
	});

	it('is off when mail does not go to the local stand-in', () => {
		expect(devMailboxUrl({ HOST: '127.0.0.1' })).toBeNull();
		expect(devMailboxUrl({ HOST: '127.0.0.1', MAILBOX_URL: '' })).toBeNull();
		expect(devMailboxUrl({ HOST: '127.0.0.1', MAILBOX_URL: 'http://mail.example.test:2626' })).toBeNull();
		expect(devMailboxUrl({ HOST: '127.0.0.1', MAILBOX_URL: 'http://127.0.0.1.example.test' })).toBeNull();
	});
});
