/** A worker bundled into one ES module, as source text (the `?server-worker` import of vite.config.ts). */
declare module '*?server-worker' {
	const source: string;
	export default source;
}
