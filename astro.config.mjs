// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwind from '@astrojs/tailwind';
import auth from 'auth-astro';

const extraHosts = (process.env.ALLOWED_HOSTS ?? '')
	.split(',')
	.map((h) => h.trim())
	.filter(Boolean)
	.map((hostname) => ({ hostname, protocol: 'https' }));

export default defineConfig({
	output: 'server',
	// npm test builds into its own folder so that a running `npm start` keeps its build.
	outDir: process.env.AMPLEDGER_DIST || './dist',
	// Middleware mode: src/server.ts mounts the handler inside Express so uploads can go through multer.
	adapter: node({ mode: 'middleware' }),
	integrations: [react(), tailwind({ applyBaseStyles: false }), auth()],
	security: {
		checkOrigin: true,
		allowedDomains: [
			{ hostname: '127.0.0.1', protocol: 'http' },
			{ hostname: 'localhost', protocol: 'http' },
			...extraHosts,
		],
	},
	server: { host: '127.0.0.1', port: 4321 },
});
