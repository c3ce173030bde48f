/**
 * Mounting Svelte components in jsdom tests. Vitest resolves `svelte` to its server build here (the
 * package's "browser" condition is not applied), so the client entry is imported by path; queries come
 * from @testing-library/dom. This avoids changing the shared vite.config.ts.
 */
// @ts-expect-error svelte's client entry has no declaration file of its own; it is typed through 'svelte' below
import * as clientEntry from '../../node_modules/svelte/src/index-client.js';
import type { Component } from 'svelte';

const svelteClient = clientEntry as typeof import('svelte');

/** Mounts `component` with `props` into a fresh container; returns it and an unmount function. */
export function renderComponent<P extends Record<string, unknown>>(
	component: Component<P>,
	props: P,
): { container: HTMLElement; unmount: () => void } {
	const container = document.createElement('div');
	document.body.append(container);
	const instance = svelteClient.mount(component, { target: container, props });
	svelteClient.flushSync();
	return {
		container,
		unmount: () => {
			svelteClient.unmount(instance);
			container.remove();
		},
	};
}

export const flushSync = (): void => svelteClient.flushSync();
