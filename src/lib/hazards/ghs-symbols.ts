/**
 * The black symbols of the nine GHS pictograms, our own drawing. The white ground inside the
 * frame is the diamond |x − 50| + |y − 50| ≤ 40; every symbol keeps about 3 units inside it.
 * White paths cut details out of the black ones painted before them.
 */
import type { PictogramPath } from './ghs-pictograms';
import { mirrored, path, placed, starPoints, type Point, type Transform } from './svg-path';

const black = (d: { toString(): string }): PictogramPath => ({ d: d.toString(), fill: 'black' });
const white = (d: { toString(): string }): PictogramPath => ({ d: d.toString(), fill: 'white' });

export function bombSymbol(): PictogramPath[] {
	const blast = starPoints([53, 47], 11, [25, 18, 22, 16], 10, -80);
	const fragments = [
		path().polygon([
			[36, 30.5],
			[39.5, 27.5],
			[40, 32]
		]),
		path().polygon([
			[66.5, 31],
			[70, 32.5],
			[66, 34.5]
		]),
		path().polygon([
			[74, 45.5],
			[78, 47.5],
			[74.5, 50]
		]),
		path().polygon([
			[27.5, 44.5],
			[31, 42],
			[31.5, 46.5]
		])
	];
	return [
		black(path().polygon(blast)),
		...fragments.map(black),
		white(path().circle([44, 62], 13)),
		black(path().circle([44, 62], 10.5)),
		white(path().ellipse([40.5, 58.5], 2.6, 1.8))
	];
}

function flames(base: Point, scale: number): string {
	const t = placed(base, 0, scale);
	return path(t)
		.tongue([0, 0], 30, 44, 4)
		.tongue([-9, 0], 16, 30, -6)
		.tongue([10, 0], 15, 28, 5)
		.toString();
}

export function flameSymbol(): PictogramPath[] {
	return [
		black(flames([50, 68], 1)),
		white(path().tongue([50, 68.5], 13, 21, 1)),
		black(path().tongue([50, 69], 6, 10, 0.5)),
		black(path().rect(37.5, 71, 25, 3.5))
	];
}

export function flameOverCircleSymbol(): PictogramPath[] {
	return [
		black(flames([50, 57], 0.9)),
		white(path().circle([50, 59.5], 12.5)),
		black(path().circle([50, 59.5], 10)),
		white(path().circle([50, 59.5], 5.5)),
		black(path().rect(39, 72, 22, 3.5))
	];
}

export function gasCylinderSymbol(): PictogramPath[] {
	const t: Transform = placed([48, 53], -35, 0.95);
	const body = path(t)
		.moveTo([-16, -10])
		.lineTo([10, -10])
		.curveTo([16, -10], [20, -6], [21, -3.5])
		.lineTo([25, -3.5])
		.lineTo([25, 3.5])
		.lineTo([21, 3.5])
		.curveTo([20, 6], [16, 10], [10, 10])
		.lineTo([-16, 10])
		.curveTo([-19, 10], [-21, 8], [-21, 5])
		.lineTo([-21, -5])
		.curveTo([-21, -8], [-19, -10], [-16, -10])
		.close();
	return [
		black(body),
		black(path(t).rect(24, -5.5, 5, 11)),
		black(path(t).rect(25.5, -11, 2.5, 6)),
		black(path(t).rect(23, -12.5, 7, 2.5)),
		white(path(t).rect(-17, -6.5, 26, 2.2))
	];
}

/** A test tube tipped from its closed end `from` to its mouth `to`, with the drops below it. */
function tubeAndDrops(from: Point, to: Point, place: Transform, mirror: boolean): PictogramPath[] {
	const m: Transform = mirror ? (p) => place(mirrored(p)) : place;
	const [dx, dy] = [to[0] - from[0], to[1] - from[1]];
	const angle = (Math.atan2(dy, dx) * 180) / Math.PI;
	const length = Math.hypot(dx, dy);
	const t: Transform = (p) => m(placed(from, angle)(p));
	const tube = path(t)
		.moveTo([length, -4])
		.lineTo([3.5, -4])
		.curveTo([-1, -4], [-1, 4], [3.5, 4])
		.lineTo([length, 4])
		.close();
	const drops = [0, 1].map((i) =>
		path(m).tongue([to[0] + 0.5, to[1] + 7.5 + i * 5], 3 - i * 0.3, 4.4 - i * 0.5)
	);
	return [black(tube), white(path(t).rect(4, -1.5, length - 6, 3)), ...drops.map(black)];
}

/** A right hand seen from above, palm down, fingers to the right, eaten away where drops land. */
function hand(t: Transform): PictogramPath[] {
	const palm = path(t).polygon([
		[26.5, 55],
		[40, 52.4],
		[41, 64.2],
		[28, 63.5]
	]);
	const thumb = path(t).bar([34, 54], [42, 49.3], 3.2).circle([42, 49.3], 1.6);
	const fingerTips = [50.5, 52, 51, 49];
	const fingers = fingerTips.map((tip, i) => {
		const y = 52.5 + i * 3;
		return path(t)
			.moveTo([39, y])
			.lineTo([tip - 1.4, y])
			.curveTo([tip + 0.4, y], [tip + 0.4, y + 2.8], [tip - 1.4, y + 2.8])
			.lineTo([39, y + 2.8])
			.close();
	});
	const gaps = path(t);
	fingerTips.slice(1).forEach((tip, i) => gaps.rect(41, 55.25 + i * 3, tip - 41, 0.5));
	gaps.bar([34.5, 55.6], [41, 52.2], 0.6);
	const bite = path(t).polygon([
		[28.5, 52],
		[30, 57.5],
		[32, 55.5],
		[33.5, 58.5],
		[35.5, 51.5]
	]);
	return [black(palm), black(thumb), ...fingers.map(black), white(gaps), white(bite)];
}

export function corrosionSymbol(): PictogramPath[] {
	const t = placed([0, 3]);
	const surface = path(t).polygon([
		[55, 56],
		[63, 56],
		[64.5, 59.5],
		[66.5, 58],
		[68.5, 61],
		[70, 56],
		[72.5, 56],
		[71, 64],
		[56, 64]
	]);
	return [
		...tubeAndDrops([41, 25], [32.5, 40], t, false),
		...tubeAndDrops([41, 25], [32.5, 40], t, true),
		...hand(t),
		black(surface)
	];
}

function bone(a: Point, b: Point): string {
	const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
	const length = Math.hypot(dx, dy);
	const [ux, uy] = [dx / length, dy / length];
	const [nx, ny] = [-uy * 2.6, ux * 2.6];
	return path()
		.bar(a, b, 4)
		.circle([a[0] + nx, a[1] + ny], 2.8)
		.circle([a[0] - nx, a[1] - ny], 2.8)
		.circle([b[0] + nx, b[1] + ny], 2.8)
		.circle([b[0] - nx, b[1] - ny], 2.8)
		.toString();
}

export function skullSymbol(): PictogramPath[] {
	const skull = path()
		.moveTo([50, 25])
		.curveTo([59.5, 25], [64, 32], [64, 40])
		.curveTo([64, 45], [61.5, 48], [59, 49.5])
		.lineTo([59, 55])
		.curveTo([59, 57], [57.5, 58], [55.5, 58])
		.lineTo([44.5, 58])
		.curveTo([42.5, 58], [41, 57], [41, 55])
		.lineTo([41, 49.5])
		.curveTo([38.5, 48], [36, 45], [36, 40])
		.curveTo([36, 32], [40.5, 25], [50, 25])
		.close();
	return [
		black(bone([38, 58.5], [62, 69.5])),
		black(bone([38, 69.5], [62, 58.5])),
		white(path().ellipse([50, 41.5], 15.5, 18)),
		black(skull),
		white(path().ellipse([44.2, 41.5], 3.9, 4.3).ellipse([55.8, 41.5], 3.9, 4.3)),
		white(
			path().polygon([
				[50, 46],
				[52.3, 50.5],
				[47.7, 50.5]
			])
		),
		white(path().rect(45.2, 53, 1.4, 5).rect(49.3, 53, 1.4, 5).rect(53.4, 53, 1.4, 5))
	];
}

export function exclamationSymbol(): PictogramPath[] {
	const stroke = path()
		.moveTo([44.5, 28])
		.curveTo([44.5, 23.5], [55.5, 23.5], [55.5, 28])
		.lineTo([52.6, 59])
		.lineTo([47.4, 59])
		.close();
	return [black(stroke), black(path().circle([50, 67.5], 4.6))];
}

export function healthHazardSymbol(): PictogramPath[] {
	const bust = path()
		.moveTo([44, 42])
		.lineTo([56, 42])
		.curveTo([63, 43], [67, 46], [67.5, 52])
		.lineTo([66, 67])
		.curveTo([62, 70], [58, 71.5], [50, 72])
		.curveTo([42, 71.5], [38, 70], [34, 67])
		.lineTo([32.5, 52])
		.curveTo([33, 46], [37, 43], [44, 42])
		.close();
	return [
		black(path().circle([50, 32.5], 8.5)),
		white(path().rect(43, 40.3, 14, 1.6)),
		black(bust),
		white(path().polygon(starPoints([50, 57], 8, [9.5, 7], 3.6, -90)))
	];
}

function tree(): PictogramPath[] {
	const trunk = path().polygon([
		[36, 68],
		[37.5, 36],
		[40, 36],
		[42, 68]
	]);
	const branches = path()
		.bar([38.5, 46], [29, 35], 2.2)
		.bar([39, 40], [46, 29], 2.2)
		.bar([39.5, 52], [50, 42], 2.2)
		.bar([38.6, 37], [35, 27], 2)
		.bar([45, 46.7], [47, 38.5], 1.8)
		.bar([33, 39.8], [29, 41], 1.6);
	return [black(trunk), black(branches)];
}

function fish(): PictogramPath[] {
	const body = path()
		.moveTo([47, 61])
		.curveTo([50, 54.5], [60, 54], [65, 58.5])
		.lineTo([71, 54.5])
		.lineTo([70, 61])
		.lineTo([71.5, 66])
		.lineTo([65, 62.5])
		.curveTo([60, 66.5], [50, 66], [47, 61])
		.close();
	const eye = path().bar([50.3, 58.5], [53.2, 61.5], 0.9).bar([50.3, 61.5], [53.2, 58.5], 0.9);
	return [black(body), white(eye)];
}

export function environmentSymbol(): PictogramPath[] {
	return [...tree(), ...fish(), black(path().rect(33, 68, 34, 2.6))];
}
