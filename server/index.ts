/**
 * The production HTTP server: Express in front of Astro's middleware-mode handler, so that upload
 * routes can use multer before Astro sees the request.
 */
import express, { type ErrorRequestHandler, type RequestHandler } from 'express';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { mountInspectionPhotoUpload } from './inspection-photo-upload';
import { mountSketchUpload } from './sketch-upload';

const root = path.resolve(import.meta.dirname, '..');
const distDir = process.env.AMPLEDGER_DIST ?? path.join(root, 'dist');

/** Builds the Express app around a built Astro handler. */
export async function createApp() {
	const entry = (await import(pathToFileURL(path.join(distDir, 'server', 'entry.mjs')).href)) as {
		handler: RequestHandler;
	};
	const app = express();
	app.disable('x-powered-by');
	app.set('trust proxy', false);

	// The client's address as this server saw it; a header sent by the client is replaced, never trusted.
	app.use((req, _res, next) => {
		req.headers['x-forwarded-for'] = req.socket.remoteAddress ?? 'unknown';
		next();
	});

	// Multipart uploads go through multer before the static files and Astro's handler.
	mountSketchUpload(app);
	mountInspectionPhotoUpload(app);

	app.use(
		express.static(path.join(distDir, 'client'), {
			index: false,
			maxAge: '1h',
			setHeaders(res, filePath) {
				if (filePath.includes(`${path.sep}_astro${path.sep}`))
					res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
			},
		}),
	);
	app.use(entry.handler);

	const onError: ErrorRequestHandler = (err, _req, res, _next) => {
		console.error('[ampledger] unhandled', err);
		if (res.headersSent) return;
		res
			.status(500)
			.json({ error: { code: 'internal', message: 'Something went wrong on our side. Please try again.' } });
	};
	app.use(onError);
	return app;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
	const host = process.env.HOST ?? '127.0.0.1';
	const port = Number(process.env.PORT ?? 4321);
	const app = await createApp();
	const server = app.listen(port, host, () => {
		console.log(`Ampledger is serving on http://${host}:${port}`);
	});
	const stop = () => server.close(() => process.exit(0));
	process.on('SIGTERM', stop);
	process.on('SIGINT', stop);
}
