import { describe, expect, it } from 'vitest';
import { PDFArray, PDFDocument, PDFRawStream, decodePDFRawStream, type PDFPage } from 'pdf-lib';
import { render } from 'svelte/server';
import GhsPictogram from '../../src/lib/components/GhsPictogram.svelte';
import { PICTOGRAM_IDS } from '../../chemistry';
import { GHS_PICTOGRAMS } from '../../src/lib/hazards/ghs-pictograms';
import { drawPictogram } from '../../src/lib/hazards/pictogram-pdf';

// What pdf-lib's drawSvgPath reads (its svgPath.ts), with each command's number of arguments.
const ARITY: Record<string, number> = {
	M: 2,
	L: 2,
	H: 1,
	V: 1,
	C: 6,
	S: 4,
	Q: 4,
	T: 2,
	A: 7,
	Z: 0
};

/** Reads path data strictly: commands, numbers, separators, nothing else. */
function parsePath(d: string): { command: string; args: number[] }[] {
	const token = /\s*,?\s*(?:([MLHVCSQTAZmlhvcsqtaz])|(-?(?:\d+\.?\d*|\.\d+)(?:e[-+]?\d+)?))/gy;
	const commands: { command: string; args: number[] }[] = [];
	let match: RegExpExecArray | null;
	while (token.lastIndex < d.length && (match = token.exec(d))) {
		if (match[1]) commands.push({ command: match[1], args: [] });
		else if (commands.length === 0) throw new Error(`a number before any command in ${d}`);
		else commands[commands.length - 1].args.push(Number(match[2]));
	}
	if (d.slice(token.lastIndex).trim() !== '') throw new Error(`unreadable at ${token.lastIndex}`);
	return commands;
}

describe('the GHS pictogram paths', () => {
	it('has all nine, each in a red frame on a white ground', () => {
		expect(Object.keys(GHS_PICTOGRAMS).sort()).toEqual([...PICTOGRAM_IDS]);
		for (const pictogram of Object.values(GHS_PICTOGRAMS)) {
			expect(pictogram.paths.slice(0, 2).map((p) => p.fill)).toEqual(['red', 'white']);
			expect(pictogram.paths.slice(2).length).toBeGreaterThan(0);
			expect(pictogram.name).toMatch(/^[A-Z][a-z ]+$/);
		}
	});

	it('writes every path with the commands pdf-lib can draw, each with whole argument sets', () => {
		for (const pictogram of Object.values(GHS_PICTOGRAMS)) {
			for (const { d } of pictogram.paths) {
				const commands = parsePath(d);
				expect(commands[0].command).toBe('M');
				for (const { command, args } of commands) {
					const arity = ARITY[command.toUpperCase()];
					expect(arity).toBeDefined();
					if (arity === 0) expect(args).toEqual([]);
					else expect(args.length > 0 && args.length % arity === 0).toBe(true);
					expect(args.every(Number.isFinite)).toBe(true);
				}
			}
		}
	});

	it('keeps every symbol on the white ground, clear of the red border', () => {
		// The white ground is |x − 50| + |y − 50| ≤ 40 (ghs-pictograms.ts); control points count
		// too, so the curves stay inside with them.
		for (const pictogram of Object.values(GHS_PICTOGRAMS)) {
			for (const { d } of pictogram.paths.slice(2)) {
				for (const { command, args } of parsePath(d)) {
					expect('MLCZ').toContain(command);
					for (let i = 0; i < args.length; i += 2) {
						const reach = Math.abs(args[i] - 50) + Math.abs(args[i + 1] - 50);
						expect([pictogram.id, reach <= 39]).toEqual([pictogram.id, true]);
					}
				}
			}
		}
	});
});

type Matrix = [number, number, number, number, number, number];
const multiply = (m: Matrix, n: Matrix): Matrix => [
	m[0] * n[0] + m[1] * n[2],
	m[0] * n[1] + m[1] * n[3],
	m[2] * n[0] + m[3] * n[2],
	m[2] * n[1] + m[3] * n[3],
	m[4] * n[0] + m[5] * n[2] + n[4],
	m[4] * n[1] + m[5] * n[3] + n[5]
];

interface Painted {
	colour: string;
	points: [number, number][];
}

/** Follows the page's content stream: where each filled path lands on the page, in points. */
function paintedShapes(page: PDFPage): Painted[] {
	const contents = page.node.Contents();
	const streams = contents instanceof PDFArray ? contents.asArray() : [contents];
	const text = streams
		.map((ref) => page.doc.context.lookup(ref as never))
		.map((s) => Buffer.from(decodePDFRawStream(s as PDFRawStream).decode()).toString('latin1'))
		.join('\n');
	const painted: Painted[] = [];
	const stack: Matrix[] = [];
	let ctm: Matrix = [1, 0, 0, 1, 0, 0];
	let colour = '';
	let points: [number, number][] = [];
	let operands: number[] = [];
	const at = (x: number, y: number): [number, number] => [
		ctm[0] * x + ctm[2] * y + ctm[4],
		ctm[1] * x + ctm[3] * y + ctm[5]
	];
	for (const token of text.split(/\s+/).filter(Boolean)) {
		if (/^-?[\d.]+$/.test(token)) operands.push(Number(token));
		else {
			if (token === 'q') stack.push(ctm);
			if (token === 'Q') ctm = stack.pop()!;
			if (token === 'cm') ctm = multiply(operands as Matrix, ctm);
			if (token === 'rg') colour = operands.join(' ');
			if (['m', 'l', 'c'].includes(token)) {
				for (let i = 0; i < operands.length; i += 2) points.push(at(operands[i], operands[i + 1]));
			}
			if (token === 'f') {
				painted.push({ colour, points });
				points = [];
			}
			operands = [];
		}
	}
	return painted;
}

function boundsOf(points: [number, number][]) {
	const xs = points.map((p) => p[0]);
	const ys = points.map((p) => p[1]);
	return {
		left: Math.min(...xs),
		right: Math.max(...xs),
		bottom: Math.min(...ys),
		top: Math.max(...ys)
	};
}

describe('drawing the pictograms into a PDF', () => {
	it('draws each into a pdf-lib page, in the square asked for', async () => {
		const pdf = await PDFDocument.create();
		const page = pdf.addPage([595, 842]);
		PICTOGRAM_IDS.forEach((id, i) =>
			drawPictogram(page, id, { x: 40 + i * 60, y: 700, sizePt: 50 })
		);
		const reloaded = await PDFDocument.load(await pdf.save());
		const shapes = paintedShapes(reloaded.getPage(0));
		const red = shapes.filter((s) => s.colour === '0.89 0 0.1');
		expect(red).toHaveLength(9);
		// The diamond spans 1.5 … 98.5 of the 100-unit box: 0.75 pt … 49.25 pt of the 50 pt square.
		const first = boundsOf(red[0].points);
		expect(first.left).toBeCloseTo(40.75, 6);
		expect(first.right).toBeCloseTo(89.25, 6);
		expect(first.bottom).toBeCloseTo(700.75, 6);
		expect(first.top).toBeCloseTo(749.25, 6);
	});

	it('keeps the picture upright (the SVG y axis points down)', async () => {
		const pdf = await PDFDocument.create();
		const page = pdf.addPage([200, 200]);
		drawPictogram(page, 'GHS07', { x: 10, y: 20, sizePt: 100 });
		const reloaded = await PDFDocument.load(await pdf.save());
		const black = paintedShapes(reloaded.getPage(0)).filter((s) => s.colour === '0 0 0');
		// The exclamation mark's dot is the last black shape, centred at y = 67.5 of the SVG box,
		// 32.5 units above the bottom: 20 + 32.5 = 52.5 pt on the page.
		const dot = boundsOf(black[black.length - 1].points);
		expect((dot.bottom + dot.top) / 2).toBeCloseTo(52.5, 6);
		expect((dot.left + dot.right) / 2).toBeCloseTo(60, 6);
	});
});

describe('the GhsPictogram component', () => {
	it('renders an image named in plain words, 40 px unless told', () => {
		const { body } = render(GhsPictogram, { props: { id: 'GHS05' } });
		expect(body).toContain('role="img"');
		expect(body).toContain('aria-label="Corrosion"');
		expect(body).toContain('<title>Corrosion</title>');
		expect(body).toContain('width="40"');
		expect(body.match(/<path /g)).toHaveLength(GHS_PICTOGRAMS.GHS05.paths.length);
		expect(render(GhsPictogram, { props: { id: 'GHS09', sizePx: 24 } }).body).toContain(
			'height="24"'
		);
	});
});
