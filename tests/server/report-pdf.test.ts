import { execFileSync } from 'node:child_process';
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { AIR_O2_MOLE_FRACTION } from '$chemistry';
import { db } from '$lib/server/db';
import { study } from '$lib/server/db/schema';
import { loadStudyReport } from '$lib/server/studies/page-load';
import { buildStudyReportPdf, type LoadedStudyReport } from '$lib/server/studies/report-pdf';
import { pdfPageTexts, readPng, renderPdfPages } from '../e2e/pdf-pages';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The report PDF as a reader sees it: poppler's pdftotext, pdffonts and pdftoppm on the file.
const YEAST_STUDY = 'Yeast glycerol fed-batch, bench (demo)'; // sparges 50 % O2
const BACTERIUM_STUDY = 'Bacterium glucose fed-batch, pilot (demo)'; // sparges air
const FIRE_CAUTION = 'Oxygen-enriched gas raises the risk of fire';
/** The report's section headings, as each line that is one begins. */
const HEADINGS = [
	'Safety cautions',
	'What it uses',
	'Verdict:',
	'Watch during the run',
	'Time course',
	'Nutrients:',
	'Oxygen:',
	'Heat:',
	'Volume:',
	'Values and defaults used'
];

const folder = join(process.cwd(), 'tests', '.tmp', `report-pdf-${process.pid}`);
beforeAll(() => mkdirSync(folder, { recursive: true }));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

async function loadByName(name: string): Promise<LoadedStudyReport> {
	const { id } = db.select({ id: study.id }).from(study).where(eq(study.name, name)).get()!;
	return loadStudyReport(id);
}

let fileCount = 0;
async function writeReport(loaded: LoadedStudyReport): Promise<string> {
	const path = join(folder, `report-${++fileCount}.pdf`);
	writeFileSync(path, await buildStudyReportPdf(loaded, new Date('2026-03-02T09:30:00Z')));
	return path;
}

/** Each page's lines of content: no blank lines, no footer. */
function contentLines(page: string): string[] {
	return page
		.split('\n')
		.map((line) => line.trim())
		.filter((line) => line && !/Page \d+ of \d+/.test(line) && !line.startsWith('Sufficiency'));
}

const isHeading = (line: string) => HEADINGS.some((heading) => line.startsWith(heading));

describe('the study report PDF', () => {
	it('prints μ and the other symbols in the embedded Lexend, never as "?"', async () => {
		const loaded = await loadByName(BACTERIUM_STUDY);
		expect(loaded.feeds[0].planText).toContain('μset');
		loaded.study.notes =
			'Symbols: 2 μm · 5 m² · 3 m³ · ± 0.1 · ≤ 5 · ≥ 2 · 30 °C · A → B · 1–2 · 2 × 3';
		const path = await writeReport(loaded);
		const text = pdfPageTexts(path).join('\n');
		// Greek μ (U+03BC) is drawn as the micro sign µ (U+00B5): Lexend has no Greek.
		expect(text).toContain('\u00b5set 0.15 /h');
		expect(text).toContain(
			'Symbols: 2 \u00b5m · 5 m² · 3 m³ · ± 0.1 · <= 5 · >= 2 · 30 °C · A -> B · 1–2 · 2 × 3'
		);
		expect(text).not.toContain('?');

		const fonts = execFileSync('pdffonts', [path], { encoding: 'utf8' }).split('\n').slice(2);
		const listed = fonts.filter((line) => line.trim());
		expect(listed.length).toBe(2);
		for (const line of listed) {
			// name, type…, encoding, then emb sub uni: the font is in the file, not borrowed.
			expect(line).toMatch(/^Lexend-(Regular|SemiBold)\b.*\s+yes\s+(yes|no)\s+yes\s+\d+\s+\d+$/);
		}
	});

	it('says the study and "Page x of y" on every page', async () => {
		const pages = pdfPageTexts(await writeReport(await loadByName(YEAST_STUDY)));
		expect(pages.length).toBeGreaterThanOrEqual(2);
		pages.forEach((page, i) => {
			expect(page).toContain(`Page ${i + 1} of ${pages.length}`);
			expect(page).toContain(`Sufficiency study: ${YEAST_STUDY}`);
			expect(page).toContain('Printed 2026-03-02 09:30');
		});
	});

	it('prints the enriched-gas caution only for a study that sparges more O2 than air', async () => {
		const enriched = pdfPageTexts(await writeReport(await loadByName(YEAST_STUDY))).join('\n');
		expect(enriched).toContain(FIRE_CAUTION);
		expect(enriched).toContain('pressure rating');
		const air = pdfPageTexts(await writeReport(await loadByName(BACTERIUM_STUDY))).join('\n');
		expect(air).not.toContain(FIRE_CAUTION);
		expect(air).toContain('pressure rating');
		expect(air).toContain('qualified engineers decide');
	});

	it('chooses the cautions by the same rule when the study cannot be evaluated', async () => {
		const loaded = await loadByName(YEAST_STUDY);
		const broken = { ...loaded, report: null, reportError: 'a test reason' };
		const enriched = pdfPageTexts(await writeReport(broken)).join('\n');
		expect(enriched).toContain('This study cannot be evaluated: a test reason');
		expect(enriched).toContain(FIRE_CAUTION);
		broken.study = { ...loaded.study, o2MoleFraction: AIR_O2_MOLE_FRACTION };
		const air = pdfPageTexts(await writeReport(broken)).join('\n');
		expect(air).not.toContain(FIRE_CAUTION);
		expect(air).toContain('pressure rating');
	});

	it('never ends a page with a heading, wherever the page breaks fall', async () => {
		const loaded = await loadByName(YEAST_STUDY);
		const report = loaded.report!;
		const course = report.timeCourse;
		if (course.check === 'unavailable') throw new Error('the yeast study has a time course');
		expect(course.events.length).toBeGreaterThan(0);
		// Extra lines before the charts (warnings) move the headings of page 1; extra lines after them
		// (the course's events, repeated) move those of the later pages, which the charts' fixed
		// height would otherwise hold in place. Each step is shorter than the room a heading keeps
		// below it, so every heading passes the foot of a page at some step.
		const shifts = [
			...Array.from({ length: 13 }, (_, i) => ({ warnings: 2 * i, events: 0 })),
			...Array.from({ length: 31 }, (_, i) => ({ warnings: 0, events: 2 * i }))
		];
		let headingsChecked = 0;
		for (const shift of shifts) {
			const shifted: LoadedStudyReport = {
				...loaded,
				report: {
					...report,
					warnings: [...report.warnings, ...Array(shift.warnings).fill('Watch this.')],
					timeCourse: {
						...course,
						events: [...course.events, ...Array(shift.events).fill(course.events[0])]
					}
				}
			};
			const pages = pdfPageTexts(await writeReport(shifted));
			pages.slice(0, -1).forEach((page, i) => {
				const last = contentLines(page).at(-1)!;
				expect(isHeading(last), `page ${i + 1} at ${JSON.stringify(shift)} ends "${last}"`).toBe(
					false
				);
			});
			headingsChecked += pages.flatMap(contentLines).filter(isHeading).length;
		}
		expect(headingsChecked).toBeGreaterThan(shifts.length * 8);
	}, 120_000);

	it('draws the time-course charts: titles, legends, and every line in its colour', async () => {
		const loaded = await loadByName(BACTERIUM_STUDY);
		const path = await writeReport(loaded);
		const text = pdfPageTexts(path).join('\n');
		for (const label of [
			'Biomass and substrate, g/L',
			'Oxygen uptake and transfer, mmol O2/(L·h)',
			'Dissolved oxygen, mg/L',
			'Broth volume, L',
			'Time, h',
			'Biomass X',
			'Substrate S',
			'OUR in this vessel',
			'O2 demand of the plan',
			'Max OTR at DO setpoint',
			'DO at 0',
			"Vessel's maximum"
		])
			expect(text).toContain(label);
		expect(text).not.toContain('the chart is in the app');

		// On the drawn pages, the lines' colours (report-charts.ts STYLES), each in many pixels.
		const pngFolder = join(folder, 'pages');
		mkdirSync(pngFolder, { recursive: true });
		const pngs = renderPdfPages(path, pngFolder, 100).map(readPng);
		const countNear = (rgb: [number, number, number]) =>
			pngs.reduce((count, png) => {
				for (let i = 0; i < png.data.length; i += 4) {
					const near = rgb.every((c, k) => Math.abs(png.data[i + k] - c * 255) < 30);
					if (near) count++;
				}
				return count;
			}, 0);
		expect(countNear([0.12, 0.37, 0.29])).toBeGreaterThan(100); // biomass
		expect(countNear([0.72, 0.47, 0.12])).toBeGreaterThan(50); // substrate, dashed
		expect(countNear([0.77, 0.19, 0.19])).toBeGreaterThan(100); // OUR
		expect(countNear([0.17, 0.42, 0.69])).toBeGreaterThan(100); // DO
	});
});
