/** Client-side calls to /api/v1 for the stratigraphy pages: JSON in and out, API errors as readable messages. */

export class RequestFailed extends Error {
	constructor(
		message: string,
		readonly status: number
	) {
		super(message);
	}
}

async function readError(res: Response): Promise<RequestFailed> {
	const body = await res.json().catch(() => ({}));
	const issues = (body?.error?.issues ?? []).map((i: { path: unknown[]; message: string }) => i.message);
	const message = [body?.error?.message ?? `${res.status} ${res.statusText}`, ...issues].join(' ');
	return new RequestFailed(message, res.status);
}

export async function getJson<T>(url: string): Promise<T> {
	const res = await fetch(url, { headers: { accept: 'application/json' } });
	if (!res.ok) throw await readError(res);
	return (await res.json()) as T;
}

export async function send<T = unknown>(method: 'POST' | 'PUT' | 'PATCH' | 'DELETE', url: string, body?: unknown): Promise<T> {
	const res = await fetch(url, {
		method,
		headers: { accept: 'application/json', ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
		body: body === undefined ? undefined : JSON.stringify(body)
	});
	if (!res.ok) throw await readError(res);
	return (res.status === 204 ? undefined : await res.json()) as T;
}

/** Properties a unit or domain may be simulated in, with labels for selects. */
export const PROPERTIES = [
	{ key: 'qc1Ncs', label: 'qc1Ncs (sands)' },
	{ key: 'suRatio', label: 'su/σ′v (clays)' },
	{ key: 'Ic', label: 'Ic' },
	{ key: 'qt', label: 'qt (kPa)' },
	{ key: 'FC', label: 'FC (%)' },
	{ key: 'Dr', label: 'Dr' },
	{ key: 'su', label: 'su (kPa)' },
	{ key: 'Qtn', label: 'Qtn' }
] as const;
export type PropertyKey = (typeof PROPERTIES)[number]['key'];

export interface Unit {
	id: string;
	name: string;
	colour: string;
	position: number;
	gammaAbove: number;
	gammaBelow: number;
	nkt: number;
	cfc: number;
	property: PropertyKey;
	zoneNames: string[];
}

export interface Site {
	geometry: '2d' | '3d';
	sectionLine: [number, number][] | null;
	offLineTolerance: number;
	groundwaterElevation: number | null;
	lengthUnit: 'm' | 'ft';
}

export interface Contact {
	soundingId: string;
	soundingName: string;
	unitId: string;
	topElevation: number;
}

export interface Boundary {
	id: string;
	unitId: string;
	chainageTop: number;
	elevationTop: number;
	chainageBottom: number;
	elevationBottom: number;
}

export interface Member {
	unitId: string;
	unitName: string;
	zone: number;
	zoneName: string;
}

export interface Domain {
	id: string;
	name: string;
	position: number;
	property: PropertyKey;
	cellHeight: number | null;
	averaging: 'none' | 'mean' | 'median';
	declusterCell: { x: number; y: number; z: number | null } | null;
	members: Member[];
}

export interface Zonation {
	id: string;
	name: string;
	description: string;
	domains: Domain[];
}

export interface SoundingSummary {
	id: string;
	name: string;
	x: number | null;
	y: number | null;
	chainage: number | null;
	offset: number | null;
	farOffLine: boolean;
	groundElevation: number;
	maxDepth: number;
}

/** A number typed in a field: null for an empty field, NaN for text that is not a number. */
export function parseNumber(text: string | number | null | undefined): number | null {
	if (text === null || text === undefined) return null;
	if (typeof text === 'number') return text;
	const t = text.trim().replace(',', '.').replace('−', '-');
	return t === '' ? null : Number(t);
}
