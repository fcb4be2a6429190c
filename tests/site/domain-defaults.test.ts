import { describe, expect, it } from 'vitest';
import { domainDefaults } from '../../src/lib/site/index';
import { expectRelClose } from '../asserts';

describe('domainDefaults(lengthUnit)', () => {
	it('domainDefaults("m") averages to 0.2 m cells and declusters on 40 m plan cells, as the demo does', () => {
		expect(domainDefaults('m')).toEqual({ cellHeight: 0.2, averaging: 'mean', declusterCell: { x: 40, y: 40, z: null } });
	});

	it('domainDefaults("ft") gives about the same lengths in feet (within 25 % for the cell height, 1 % for the plan cell)', () => {
		const ft = domainDefaults('ft');
		const m = domainDefaults('m');
		const FT = 0.3048; // m per international foot, exact by definition
		expectRelClose(ft.cellHeight * FT, m.cellHeight, 0.25, 'cell height');
		expectRelClose(ft.declusterCell.x * FT, m.declusterCell.x, 0.01, 'plan cell');
		expect(ft.declusterCell.y).toBe(ft.declusterCell.x);
	});
});
