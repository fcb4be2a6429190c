/** Saving a plot: an SVG element as a standalone .svg file or a 2× PNG, and text (CSV) as a file. */

function save(blob: Blob, filename: string): void {
	const url = URL.createObjectURL(blob);
	const a = document.createElement('a');
	a.href = url;
	a.download = filename;
	document.body.append(a);
	a.click();
	a.remove();
	setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The SVG markup of an element, standalone (namespace, white background, the app's font named). */
export function svgMarkup(svg: SVGSVGElement): string {
	const clone = svg.cloneNode(true) as SVGSVGElement;
	clone.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
	clone.setAttribute('font-family', "'IBM Plex Sans', sans-serif");
	// Handles and hover marks are for the screen, not for the figure.
	clone.querySelectorAll('[data-screen-only]').forEach((n) => n.remove());
	const bg = document.createElementNS('http://www.w3.org/2000/svg', 'rect');
	bg.setAttribute('width', '100%');
	bg.setAttribute('height', '100%');
	bg.setAttribute('fill', '#ffffff');
	clone.insertBefore(bg, clone.firstChild);
	return new XMLSerializer().serializeToString(clone);
}

export function downloadSvg(svg: SVGSVGElement, filename: string): void {
	save(new Blob([svgMarkup(svg)], { type: 'image/svg+xml' }), filename);
}

export async function downloadPng(svg: SVGSVGElement, filename: string, scale = 2): Promise<void> {
	const { width, height } = svg.viewBox.baseVal;
	const url = URL.createObjectURL(new Blob([svgMarkup(svg)], { type: 'image/svg+xml' }));
	try {
		const img = new Image();
		await new Promise<void>((resolve, reject) => {
			img.onload = () => resolve();
			img.onerror = () => reject(new Error('could not draw the plot'));
			img.src = url;
		});
		const canvas = document.createElement('canvas');
		canvas.width = Math.round(width * scale);
		canvas.height = Math.round(height * scale);
		const ctx = canvas.getContext('2d')!;
		ctx.scale(scale, scale);
		ctx.drawImage(img, 0, 0, width, height);
		const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
		if (blob) save(blob, filename);
	} finally {
		URL.revokeObjectURL(url);
	}
}

export function downloadText(text: string, filename: string, type = 'text/csv'): void {
	save(new Blob([text], { type }), filename);
}
