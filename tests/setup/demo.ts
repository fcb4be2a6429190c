/** The seeded demo accounts (mirrors src/lib/server/services/demo.ts and README.md). */
export const DEMO = {
	admin: { email: 'admin@conefield.test', password: 'demo-admin-pass' },
	owner: { email: 'owner@conefield.test', password: 'demo-owner-pass' },
	analyst: { email: 'analyst@conefield.test', password: 'demo-analyst-pass' },
	reviewer: { email: 'reviewer@conefield.test', password: 'demo-reviewer-pass' },
	viewer: { email: 'viewer@conefield.test', password: 'demo-viewer-pass' }
} as const;

export const DEMO_PROJECT_NAME = 'Riverside levee (demo)';
