// The production server: adapter-node's request handler (build/handler.js) behind two things
// adapter-node's own entry (build/index.js) cannot add:
//   - headers on every response, static files included: nosniff, no framing, a referrer policy;
//   - compression of dynamic text responses (HTML, JSON, CSV, iCalendar) by Accept-Encoding,
//     brotli or gzip, with the `compression` middleware. Static files stay as adapter-node
//     precompressed them; downloads that stream (the season workbook) are not compressible
//     types and pass through untouched, chunk by chunk.
// Everything else follows build/index.js: the same environment variables (HOST, PORT,
// SOCKET_PATH, ORIGIN, BODY_SIZE_LIMIT, ADDRESS_HEADER, PROTOCOL_HEADER, XFF_DEPTH,
// SHUTDOWN_TIMEOUT, KEEP_ALIVE_TIMEOUT, HEADERS_TIMEOUT), the same graceful shutdown on
// SIGTERM / SIGINT and the same `sveltekit:shutdown` event the app's hooks listen for.
//
// Usage: node scripts/serve.js [build-folder]   (default: $FC_BUILD_DIR or build)
import http from 'node:http';
import path from 'node:path';
import process from 'node:process';
import { pathToFileURL } from 'node:url';
import compression from 'compression';

const buildDir = path.resolve(process.argv[2] ?? process.env.FC_BUILD_DIR ?? 'build');
const { handler } = await import(pathToFileURL(path.join(buildDir, 'handler.js')).href);

const env = (name, fallback) => (name in process.env ? process.env[name] : fallback);
const socketPath = env('SOCKET_PATH', undefined);
const host = env('HOST', '0.0.0.0');
const port = env('PORT', socketPath ? undefined : '3000');
const shutdownTimeout = parseInt(env('SHUTDOWN_TIMEOUT', '30'), 10);

/** Set on every response before the app or the static handler answers; pages replace the
 *  Content-Security-Policy with their own (svelte.config.js `kit.csp`), which keeps frame-ancestors. */
const baseHeaders = {
	'X-Content-Type-Options': 'nosniff',
	'Content-Security-Policy': "default-src 'none'; frame-ancestors 'none'",
	'X-Frame-Options': 'DENY',
	'Referrer-Policy': 'same-origin'
};

// Dynamic text worth compressing. Event streams would stall in a compressor's buffer, and
// spreadsheets, images and fonts are compressed already.
const compressible =
	/^(text\/(html|plain|csv|calendar|css|javascript)|application\/(json|javascript|xml)|image\/svg\+xml)\b/i;
const compress = compression({
	threshold: 1024,
	filter: (req, res) => {
		const type = String(res.getHeader('Content-Type') ?? '');
		return compressible.test(type) && !/text\/event-stream/i.test(type);
	}
});

const notFound = (_req, res) => {
	res.statusCode = 404;
	res.end('Not found');
};

const httpServer = http.createServer((req, res) => {
	for (const [name, value] of Object.entries(baseHeaders)) res.setHeader(name, value);
	compress(req, res, (err) => {
		if (err) {
			res.statusCode = 500;
			res.end();
			return;
		}
		handler(req, res, () => notFound(req, res));
	});
});
const keepAlive = env('KEEP_ALIVE_TIMEOUT', undefined);
if (keepAlive !== undefined) httpServer.keepAliveTimeout = Number(keepAlive) * 1000;
const headersTimeout = env('HEADERS_TIMEOUT', undefined);
if (headersTimeout !== undefined) httpServer.headersTimeout = Number(headersTimeout) * 1000;

let shutdownTimer;
httpServer.on('request', (req) => {
	// While shutting down, close connections as soon as they become idle.
	req.on('close', () => shutdownTimer && httpServer.closeIdleConnections());
});

function shutdown(reason) {
	if (shutdownTimer) return;
	httpServer.closeIdleConnections();
	httpServer.close((error) => {
		if (error) return;
		clearTimeout(shutdownTimer);
		process.emit('sveltekit:shutdown', reason);
	});
	shutdownTimer = setTimeout(() => httpServer.closeAllConnections(), shutdownTimeout * 1000);
}
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);

httpServer.listen(socketPath ? { path: socketPath } : { host, port: Number(port) }, () => {
	console.log(`Listening on ${socketPath ?? `http://${host}:${port}`}`);
});
