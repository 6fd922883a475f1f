/// <reference types="astro/client" />

declare namespace App {
	interface Locals {
		/** The signed-in person with their roles and links, or null when signed out. */
		user: import('./lib/roles').CurrentUser | null;
	}
}
