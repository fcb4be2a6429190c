/** Request bodies of the site, stratigraphy, zonation and domain endpoints. */
import { z } from 'zod';
import { PROPERTY_KEYS, SIMULATED_PROPERTIES } from '$lib/properties';
import { displayName } from './common';
import { coordinate, COORDINATE_LIMIT, elevation } from './bounds';

const finite = (label: string) => z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, { error: `${label} must be finite.` });
const positive = (label: string) => finite(label).refine((v) => v > 0, { error: `${label} must be greater than 0.` });
const name = (label: string) => displayName(80, { required: `Enter a ${label}.`, tooLong: `Use at most 80 characters for the ${label}.` });

export const simulatedProperty = z.enum(SIMULATED_PROPERTIES, {
	error: `Choose a property: ${SIMULATED_PROPERTIES.join(', ')}.`
});

/** Quantities the section can draw as traces: every property of the catalogue. */
export const sectionProperty = z.enum(PROPERTY_KEYS, { error: 'Choose a property to draw.' });

export const colour = z
	.string({ error: 'Enter a colour.' })
	.regex(/^#[0-9a-fA-F]{6}$/, { error: 'Use a colour like #a07c4f.' })
	.transform((c) => c.toLowerCase());

const point = z.tuple([coordinate('Easting'), coordinate('Northing')]);

export const siteUpdateSchema = z
	.object({
		geometry: z.enum(['2d', '3d'], { error: 'Choose 2d or 3d.' }),
		sectionLine: z.array(point).min(2, { error: 'The section line needs at least two points.' }).max(200).nullable(),
		offLineTolerance: positive('The off-line tolerance').refine((v) => v <= COORDINATE_LIMIT, { error: 'The off-line tolerance must be at most 100,000,000.' }),
		groundwaterElevation: elevation('The groundwater elevation').nullable()
	})
	.partial()
	.strict();

const unitFields = {
	name: name('unit name'),
	colour,
	position: z.number().int({ error: 'The position must be a whole number.' }).min(0),
	gammaAbove: positive('The unit weight above the water table').refine((v) => v <= 30, { error: 'Unit weights above 30 kN/m³ are not soil.' }),
	gammaBelow: positive('The unit weight below the water table').refine((v) => v <= 30, { error: 'Unit weights above 30 kN/m³ are not soil.' }),
	nkt: positive('Nkt').refine((v) => v <= 50, { error: 'Nkt above 50 is implausible.' }),
	cfc: finite('CFC').refine((v) => v >= -1 && v <= 1, { error: 'CFC must lie within −1 and 1.' }),
	property: simulatedProperty,
	zoneNames: z.array(name('zone name')).max(20).nullable()
};

/** A new unit names the property it is simulated in: no silent default that suits sands for a clay. */
export const unitCreateSchema = z
	.object({
		...z.object(unitFields).partial().shape,
		name: unitFields.name,
		property: z.enum(SIMULATED_PROPERTIES, {
			error: `Choose the property to simulate the unit in (qc1Ncs for sands, suRatio for clays; any of ${SIMULATED_PROPERTIES.join(', ')}).`
		})
	})
	.strict();
export const unitUpdateSchema = z.object(unitFields).partial().strict();

export const contactPutSchema = z
	.object({
		soundingId: z.string().min(1, { error: 'Choose a sounding.' }),
		unitId: z.string().min(1, { error: 'Choose a unit.' }),
		topElevation: elevation('The top elevation')
	})
	.strict();

export const contactDeleteSchema = z
	.object({ soundingId: z.string().min(1), unitId: z.string().min(1) })
	.strict();

/** The most contacts one request may edit: a few hundred soundings × a dozen units, with room to spare. */
export const MAX_CONTACT_EDITS = 5000;

/**
 * Several contact edits at once (a block pasted from a spreadsheet, an undo): tops to set, contacts to remove,
 * soundings whose contacts should follow their neighbours again. All or nothing.
 */
export const contactsPatchSchema = z
	.object({
		set: z.array(contactPutSchema).max(MAX_CONTACT_EDITS, { error: `Edit at most ${MAX_CONTACT_EDITS} contacts at once.` }).default([]),
		remove: z.array(contactDeleteSchema).max(MAX_CONTACT_EDITS, { error: `Edit at most ${MAX_CONTACT_EDITS} contacts at once.` }).default([]),
		interpolate: z.array(z.string().min(1)).max(MAX_CONTACT_EDITS).default([])
	})
	.strict()
	.refine((p) => p.set.length + p.remove.length + p.interpolate.length > 0, { error: 'Nothing to change: give set, remove or interpolate.' });

export const zoneBoundarySchema = z
	.object({
		unitId: z.string().min(1, { error: 'Choose a unit.' }),
		chainageTop: coordinate('The top chainage'),
		elevationTop: elevation('The top elevation'),
		chainageBottom: coordinate('The bottom chainage'),
		elevationBottom: elevation('The bottom elevation')
	})
	.strict()
	.refine((b) => b.elevationTop > b.elevationBottom, {
		error: 'The top of a zone boundary must be higher than its bottom.',
		path: ['elevationBottom']
	});

export const zoneBoundaryUpdateSchema = z.object({ id: z.string().min(1) }).and(zoneBoundarySchema);
export const zoneBoundaryDeleteSchema = z.object({ id: z.string().min(1) }).strict();

export const memberSchema = z
	.object({
		unitId: z.string().min(1, { error: 'Choose a unit.' }),
		zone: z.number().int().min(-1, { error: 'The zone is −1 (whole unit) or a zone index from 0.' })
	})
	.strict();

const declusterCell = z
	.object({
		x: positive('The cell size along x'),
		y: positive('The cell size along y'),
		/** null: one cell over the full height, the usual choice for vertical soundings. */
		z: positive('The cell height').nullable()
	})
	.strict()
	.nullable();

const nonNegative = (label: string, max: number, unit: string) =>
	finite(label)
		.refine((v) => v >= 0, { error: `${label} must not be negative.` })
		.refine((v) => v <= max, { error: `${label} above ${max} ${unit} leaves nothing.` });

/** A domain's conditioning data rules (ConditioningRules in $lib/site); 0 switches a limit off. */
export const conditioningRulesSchema = z
	.object({
		contactBuffer: nonNegative('The buffer at contacts', 5, 'm'),
		minDepth: nonNegative('The minimum depth', 100, 'm'),
		minSigmaVeff: nonNegative('The minimum σ′v', 2000, 'kPa'),
		excludedSoundings: z.array(z.string().trim().min(1).max(80)).max(1000),
		flagged: z.enum(['keep', 'exclude'], { error: 'Choose keep or exclude for flagged readings.' })
	})
	.strict();

const domainFields = {
	name: name('domain name'),
	property: simulatedProperty,
	cellHeight: positive('The cell height').nullable(),
	averaging: z.enum(['none', 'mean', 'median'], { error: 'Choose none, mean or median.' }),
	declusterCell,
	members: z.array(memberSchema).max(100),
	rules: conditioningRulesSchema
};

export const domainCreateSchema = z
	.object(domainFields)
	.partial()
	.required({ name: true, property: true })
	.strict();
export const domainUpdateSchema = z.object(domainFields).partial().strict();

export const zonationCreateSchema = z
	.object({
		name: name('zonation name'),
		description: z.string().trim().max(2000).default(''),
		domains: z.array(domainCreateSchema).max(50).default([])
	})
	.strict();
export const zonationUpdateSchema = z
	.object({ name: name('zonation name'), description: z.string().trim().max(2000) })
	.partial()
	.strict();

export type SectionProperty = z.output<typeof sectionProperty>;
export type SiteUpdateInput = z.output<typeof siteUpdateSchema>;
export type UnitCreate = z.output<typeof unitCreateSchema>;
export type UnitUpdate = z.output<typeof unitUpdateSchema>;
export type ContactPut = z.output<typeof contactPutSchema>;
export type ContactsPatch = z.output<typeof contactsPatchSchema>;
export type ZoneBoundaryInput = z.output<typeof zoneBoundarySchema>;
export type MemberInput = z.output<typeof memberSchema>;
export type DomainCreate = z.output<typeof domainCreateSchema>;
export type DomainUpdate = z.output<typeof domainUpdateSchema>;
export type ConditioningRulesInput = z.output<typeof conditioningRulesSchema>;
export type ZonationCreate = z.output<typeof zonationCreateSchema>;
export type ZonationUpdate = z.output<typeof zonationUpdateSchema>;
