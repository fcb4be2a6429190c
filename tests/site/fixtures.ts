/** An L-shaped section line: 100 along +x, then 100 along +y. Values in the tests are worked by hand on it. */
export const L: [number, number][] = [
	[0, 0],
	[100, 0],
	[100, 100]
];
