/**
 * The audit log's catalogue: the kinds of change a project's log records, with their labels. The database enum,
 * the query schema and the page's filter list derive from it.
 */
export const AUDIT_KINDS = ['sounding', 'unit', 'contact', 'zone-boundary', 'site', 'zonation', 'domain', 'variogram', 'recipe', 'member', 'export'] as const;
export type AuditKind = (typeof AUDIT_KINDS)[number];

export const AUDIT_KIND_LABELS: Record<AuditKind, string> = {
	sounding: 'Soundings',
	unit: 'Units',
	contact: 'Contacts',
	'zone-boundary': 'Zone boundaries',
	site: 'Site settings',
	zonation: 'Zonations',
	domain: 'Domains and their rules',
	variogram: 'Variograms',
	recipe: 'Recipes',
	member: 'Members',
	export: 'Exports'
};
