// comlink ships types for its node adapter as node-adapter.d.ts, which TypeScript does not pair with the .mjs file.
declare module 'comlink/dist/esm/node-adapter.mjs' {
	import type { Endpoint } from 'comlink';
	export interface NodeEndpoint {
		// eslint-disable-next-line @typescript-eslint/no-explicit-any
		postMessage(message: any, transfer?: any[]): void;
		// eslint-disable-next-line @typescript-eslint/no-explicit-any -- matches worker_threads' (value: any) listeners
		on(type: 'message', listener: (value: any) => void): unknown;
		// eslint-disable-next-line @typescript-eslint/no-explicit-any
		off(type: 'message', listener: (value: any) => void): unknown;
		start?: () => void;
	}
	export default function nodeEndpoint(nep: NodeEndpoint): Endpoint;
}
