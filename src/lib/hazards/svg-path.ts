/**
 * Builds SVG path data from straight lines and cubic Bézier curves only (M, L, C, Z), so the same
 * string draws in a browser and through pdf-lib's drawSvgPath. Circles are four cubic arcs.
 * Every point goes through an affine transform, which maps Bézier curves exactly. Every outline
 * is closed.
 */
export type Point = readonly [number, number];
export type Transform = (p: Point) => Point;

export const identity: Transform = (p) => p;

/** Rotate by `degrees` (clockwise on screen, where y points down) about the origin, then move to `to`. */
export function placed(to: Point, degrees = 0, scale = 1): Transform {
	const a = (degrees * Math.PI) / 180;
	const [cos, sin] = [Math.cos(a) * scale, Math.sin(a) * scale];
	return ([x, y]) => [to[0] + x * cos - y * sin, to[1] + x * sin + y * cos];
}

/** Mirror left–right about x = 50, the middle of the 100 × 100 box. */
export const mirrored: Transform = ([x, y]) => [100 - x, y];

// Four cubic segments approximate a quarter circle each to within 0.03 % of the radius.
const KAPPA = 0.5522847498;

function format(n: number): string {
	const rounded = Math.round(n * 100) / 100;
	return Object.is(rounded, -0) ? '0' : String(rounded);
}

type Segment = { kind: 'L'; to: Point } | { kind: 'C'; c1: Point; c2: Point; to: Point };

interface Subpath {
	start: Point;
	segments: Segment[];
}

/** Twice the signed area of the polygon through the anchors and control points (y down). */
function orientation({ start, segments }: Subpath): number {
	const points = [
		start,
		...segments.flatMap((s) => (s.kind === 'L' ? [s.to] : [s.c1, s.c2, s.to]))
	];
	let area = 0;
	for (let i = 0; i < points.length; i++) {
		const [a, b] = [points[i], points[(i + 1) % points.length]];
		area += a[0] * b[1] - b[0] * a[1];
	}
	return area;
}

/** The same closed outline run backwards. */
function reversed({ start, segments }: Subpath): Subpath {
	const ends = [start, ...segments.map((s) => s.to)];
	const out: Segment[] = [];
	for (let i = segments.length - 1; i >= 0; i--) {
		const s = segments[i];
		const to = ends[i];
		out.push(s.kind === 'L' ? { kind: 'L', to } : { kind: 'C', c1: s.c2, c2: s.c1, to });
	}
	return { start: ends[ends.length - 1], segments: out };
}

/**
 * Every closed outline is turned to run the same way round before it is written: with the nonzero
 * fill rule (the default of SVG and of pdf-lib's fill) overlapping parts of one path then always
 * add up, never cancel into a hole. Holes are painted white on top instead.
 */
export class PathBuilder {
	private readonly done: Subpath[] = [];
	private current: Subpath | null = null;

	constructor(private readonly map: Transform = identity) {}

	moveTo(p: Point): this {
		this.finish();
		this.current = { start: this.map(p), segments: [] };
		return this;
	}

	lineTo(p: Point): this {
		this.open().segments.push({ kind: 'L', to: this.map(p) });
		return this;
	}

	curveTo(c1: Point, c2: Point, p: Point): this {
		const [a, b, to] = [this.map(c1), this.map(c2), this.map(p)];
		this.open().segments.push({ kind: 'C', c1: a, c2: b, to });
		return this;
	}

	close(): this {
		this.finish();
		return this;
	}

	private open(): Subpath {
		if (!this.current) throw new Error('a path segment needs a moveTo first');
		return this.current;
	}

	private finish(): void {
		if (!this.current) return;
		const subpath = this.current;
		this.done.push(orientation(subpath) < 0 ? reversed(subpath) : subpath);
		this.current = null;
	}

	polygon(points: readonly Point[]): this {
		points.forEach((p, i) => (i === 0 ? this.moveTo(p) : this.lineTo(p)));
		return this.close();
	}

	ellipse([cx, cy]: Point, rx: number, ry = rx): this {
		const [kx, ky] = [rx * KAPPA, ry * KAPPA];
		return this.moveTo([cx + rx, cy])
			.curveTo([cx + rx, cy + ky], [cx + kx, cy + ry], [cx, cy + ry])
			.curveTo([cx - kx, cy + ry], [cx - rx, cy + ky], [cx - rx, cy])
			.curveTo([cx - rx, cy - ky], [cx - kx, cy - ry], [cx, cy - ry])
			.curveTo([cx + kx, cy - ry], [cx + rx, cy - ky], [cx + rx, cy])
			.close();
	}

	circle(center: Point, r: number): this {
		return this.ellipse(center, r, r);
	}

	rect(x: number, y: number, width: number, height: number): this {
		return this.polygon([
			[x, y],
			[x + width, y],
			[x + width, y + height],
			[x, y + height]
		]);
	}

	/** A straight stroke of `width` from `a` to `b`, square ends. */
	bar(a: Point, b: Point, width: number): this {
		const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
		const length = Math.hypot(dx, dy);
		const [nx, ny] = [(-dy / length) * (width / 2), (dx / length) * (width / 2)];
		return this.polygon([
			[a[0] + nx, a[1] + ny],
			[b[0] + nx, b[1] + ny],
			[b[0] - nx, b[1] - ny],
			[a[0] - nx, a[1] - ny]
		]);
	}

	/** A flame tongue or a drop: standing on (cx, baseY), `height` tall, its tip leaning by `lean`. */
	tongue([cx, baseY]: Point, width: number, height: number, lean = 0): this {
		const [w, h] = [width / 2, height];
		const tip: Point = [cx + lean, baseY - h];
		return this.moveTo(tip)
			.curveTo(
				[tip[0] + 0.15 * w, tip[1] + 0.3 * h],
				[cx + w, baseY - 0.5 * h],
				[cx + w, baseY - 0.22 * h]
			)
			.curveTo([cx + w, baseY - 0.06 * h], [cx + 0.55 * w, baseY], [cx, baseY])
			.curveTo([cx - 0.55 * w, baseY], [cx - w, baseY - 0.06 * h], [cx - w, baseY - 0.22 * h])
			.curveTo([cx - w, baseY - 0.5 * h], [tip[0] - 0.15 * w, tip[1] + 0.3 * h], tip)
			.close();
	}

	/** Every point the path passes through or bends towards (for bounds checks). */
	points(): Point[] {
		this.finish();
		return this.done.flatMap((s) => [
			s.start,
			...s.segments.flatMap((g) => (g.kind === 'L' ? [g.to] : [g.c1, g.c2, g.to]))
		]);
	}

	toString(): string {
		this.finish();
		const xy = (p: Point) => `${format(p[0])} ${format(p[1])}`;
		return this.done
			.map(({ start, segments }) => {
				const body = segments.map((g) =>
					g.kind === 'L' ? `L ${xy(g.to)}` : `C ${xy(g.c1)} ${xy(g.c2)} ${xy(g.to)}`
				);
				return [`M ${xy(start)}`, ...body, 'Z'].join(' ');
			})
			.join(' ');
	}
}

export function path(map: Transform = identity): PathBuilder {
	return new PathBuilder(map);
}

/** Points on a star around `center`: `spikes` tips at `outer` radii (cycled), valleys at `inner`. */
export function starPoints(
	center: Point,
	spikes: number,
	outer: readonly number[],
	inner: number,
	startDegrees = -90
): Point[] {
	const points: Point[] = [];
	for (let i = 0; i < spikes * 2; i++) {
		const r = i % 2 === 0 ? outer[(i / 2) % outer.length] : inner;
		const a = ((startDegrees + (i * 180) / spikes) * Math.PI) / 180;
		points.push([center[0] + r * Math.cos(a), center[1] + r * Math.sin(a)]);
	}
	return points;
}
