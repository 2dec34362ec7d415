// Where uploaded files live: a folder on local disk by default, or an S3-compatible bucket when
// S3_ENDPOINT and S3_BUCKET are set (plain signed HTTP, AWS Signature Version 4), so several app
// servers can share one store. Keys are chosen by the app, never by the uploader.
import { createHash, createHmac } from 'node:crypto';
import { mkdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';

export interface FileStore {
	/** Where files go, for logs and the health page (no secrets). */
	readonly description: string;
	put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
	/** The bytes, or null when nothing is stored under the key. */
	get(key: string): Promise<Uint8Array | null>;
	remove(key: string): Promise<void>;
}

// Our keys: folders and file names of letters, digits, dashes and dots, never "..".
const KEY = /^[a-z0-9-]+(\/[a-z0-9-]+)*\.[a-z0-9]+$/;

function checkKey(key: string): string {
	if (!KEY.test(key)) throw new Error(`Storage key "${key}" is not one the app makes.`);
	return key;
}

/** The default folder: `.data/uploads` in the checkout, beside the private database (ignored by git). */
export function defaultUploadsDir(): string {
	return resolve(process.env.UPLOADS_DIR || join(process.cwd(), '.data', 'uploads'));
}

export function diskStore(root = defaultUploadsDir()): FileStore {
	const path = (key: string) => join(root, ...checkKey(key).split('/'));
	return {
		description: `folder ${root}`,
		async put(key, bytes) {
			const target = path(key);
			await mkdir(dirname(target), { recursive: true });
			// Write beside and rename, so a reader never sees half a file.
			const partial = `${target}.${process.pid}.partial`;
			await writeFile(partial, bytes);
			await rename(partial, target);
		},
		async get(key) {
			try {
				return new Uint8Array(await readFile(path(key)));
			} catch (e) {
				if ((e as { code?: string }).code === 'ENOENT') return null;
				throw e;
			}
		},
		async remove(key) {
			await rm(path(key), { force: true });
		}
	};
}

export interface S3Settings {
	endpoint: string; // e.g. https://s3.us-east-1.amazonaws.com or http://127.0.0.1:9000
	bucket: string;
	region: string;
	accessKeyId: string;
	secretAccessKey: string;
}

const sha256Hex = (data: string | Uint8Array) => createHash('sha256').update(data).digest('hex');
const hmac = (key: string | Buffer, data: string) => createHmac('sha256', key).update(data).digest();

// RFC 3986 encoding as Signature Version 4 wants it ("/" kept in paths).
function uriEncode(text: string, keepSlash: boolean): string {
	return encodeURIComponent(text)
		.replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`)
		.replace(/%2F/g, keepSlash ? '/' : '%2F');
}

/**
 * Headers that sign one S3 request with AWS Signature Version 4 (header form, payload hashed).
 * Pure apart from the clock, which the caller passes in.
 */
export function signS3Request(
	s: Pick<S3Settings, 'region' | 'accessKeyId' | 'secretAccessKey'>,
	request: { method: string; url: URL; headers?: Record<string, string>; payloadHash: string },
	now: Date
): Record<string, string> {
	const amzDate = now.toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, '');
	const day = amzDate.slice(0, 8);
	const headers: Record<string, string> = {};
	for (const [k, v] of Object.entries(request.headers ?? {})) headers[k.toLowerCase()] = v.trim();
	headers.host = request.url.host;
	headers['x-amz-date'] = amzDate;
	headers['x-amz-content-sha256'] = request.payloadHash;
	const names = Object.keys(headers).sort();
	const query = [...request.url.searchParams.entries()]
		.map(([k, v]) => `${uriEncode(k, false)}=${uriEncode(v, false)}`)
		.sort()
		.join('&');
	const canonical = [
		request.method,
		uriEncode(decodeURIComponent(request.url.pathname), true),
		query,
		names.map((n) => `${n}:${headers[n]}\n`).join(''),
		names.join(';'),
		request.payloadHash
	].join('\n');
	const scope = `${day}/${s.region}/s3/aws4_request`;
	const toSign = ['AWS4-HMAC-SHA256', amzDate, scope, sha256Hex(canonical)].join('\n');
	const key = hmac(hmac(hmac(hmac(`AWS4${s.secretAccessKey}`, day), s.region), 's3'), 'aws4_request');
	const signature = createHmac('sha256', key).update(toSign).digest('hex');
	const out: Record<string, string> = { ...headers };
	delete out.host; // fetch sets it
	out.authorization = `AWS4-HMAC-SHA256 Credential=${s.accessKeyId}/${scope}, SignedHeaders=${names.join(';')}, Signature=${signature}`;
	return out;
}

/** A bucket addressed path-style (endpoint/bucket/key), which every S3-compatible server accepts. */
export function s3Store(s: S3Settings): FileStore {
	const url = (key: string) => new URL(`${s.endpoint.replace(/\/+$/, '')}/${uriEncode(s.bucket, false)}/${uriEncode(checkKey(key), true)}`);
	async function send(method: string, key: string, body?: Uint8Array, contentType?: string): Promise<Response> {
		const target = url(key);
		const headers = signS3Request(
			s,
			{ method, url: target, headers: contentType ? { 'content-type': contentType } : {}, payloadHash: sha256Hex(body ?? '') },
			new Date()
		);
		return fetch(target, { method, headers, body: body ? Buffer.from(body) : undefined });
	}
	return {
		description: `bucket ${s.bucket} at ${s.endpoint}`,
		async put(key, bytes, contentType) {
			const res = await send('PUT', key, bytes, contentType);
			if (!res.ok) throw new Error(`The file store refused to keep ${key} (HTTP ${res.status}).`);
		},
		async get(key) {
			const res = await send('GET', key);
			if (res.status === 404) return null;
			if (!res.ok) throw new Error(`The file store did not return ${key} (HTTP ${res.status}).`);
			return new Uint8Array(await res.arrayBuffer());
		},
		async remove(key) {
			const res = await send('DELETE', key);
			if (!res.ok && res.status !== 404) throw new Error(`The file store did not delete ${key} (HTTP ${res.status}).`);
		}
	};
}

/** S3 settings from the environment; null when no bucket is configured. Half a configuration is an error. */
export function s3SettingsFromEnv(env: Record<string, string | undefined> = process.env): S3Settings | null {
	const names = ['S3_ENDPOINT', 'S3_BUCKET', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY'] as const;
	const given = names.filter((n) => env[n]);
	if (given.length === 0) return null;
	if (given.length < names.length) {
		const missing = names.filter((n) => !env[n]).join(', ');
		throw new Error(`File storage in a bucket is only partly configured: set ${missing} as well, or unset the S3_* settings to keep files on local disk.`);
	}
	return {
		endpoint: env.S3_ENDPOINT!,
		bucket: env.S3_BUCKET!,
		accessKeyId: env.S3_ACCESS_KEY_ID!,
		secretAccessKey: env.S3_SECRET_ACCESS_KEY!,
		region: env.S3_REGION || 'us-east-1'
	};
}

let current: FileStore | undefined;

/** The store this process uses, chosen once from the environment. */
export function fileStore(): FileStore {
	if (!current) {
		const s3 = s3SettingsFromEnv();
		current = s3 ? s3Store(s3) : diskStore();
	}
	return current;
}
