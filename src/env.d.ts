/// <reference types="astro/client" />

declare namespace App {
	interface Locals {
		/** The signed-in person with their roles and links, or null when signed out. */
		// eslint-disable-next-line @typescript-eslint/consistent-type-imports -- an ambient file cannot use import statements
		user: import('./lib/roles').CurrentUser | null;
	}
}
