import { formatDateTime } from '$lib/date-time';
import { siteTimeZone } from '../site-time-zone';
import { PDFDocument } from 'pdf-lib';
import { VALUE_CONFIDENCE_WORDS, studyCautions } from '$chemistry';
import {
	formatAmount,
	formatCells,
	formatRunout,
	listValueSources
} from '$lib/components/studies/format';
import { FEED_PLAN_LABELS, TARGET_BASIS_UNITS } from '$lib/studies';
import { embedLexend } from '../pdf/fonts';
import { MARGIN, Writer, type TableColumn } from '../pdf/layout';
import { stampPageFooters } from '../pdf/page-footer';
import type { loadStudyReport } from './page-load';
import { writeTimeCourse } from './report-charts';

export type LoadedStudyReport = Awaited<ReturnType<typeof loadStudyReport>>;

const CAUTION_COLOR: [number, number, number] = [0.6, 0.1, 0.1];
/** Explanations and notes: smaller than the body text. */
const SMALL_PT = 8.5;

function describeVersion(v: {
	recipeName: string;
	n: number;
	status: string;
	superseded: boolean;
	supersededBy: number | null;
}): string {
	return `${v.recipeName} v${v.n} (${v.status}${v.superseded ? `, superseded${v.supersededBy ? ` by v${v.supersededBy}` : ''}` : ''})`;
}

/** A file name that any browser and file system accepts, from the study's name. */
export function toSafeFileName(name: string): string {
	const safe = name
		.normalize('NFKD')
		.replace(/[^\w .,()-]+/g, '_')
		.replace(/\s+/g, ' ')
		.trim()
		.slice(0, 100);
	return safe || 'study';
}

type Report = NonNullable<LoadedStudyReport['report']>;

/**
 * The sufficiency-study report as a PDF: the same content as the print view, its time-course charts
 * drawn in vector, in the app's typeface, with the study and page x of y on every page.
 */
export async function buildStudyReportPdf(
	loaded: LoadedStudyReport,
	printedAt = new Date()
): Promise<Uint8Array> {
	const { study, report } = loaded;
	const doc = await PDFDocument.create();
	doc.setTitle(`Sufficiency study: ${study.name}`);
	doc.setSubject(
		report
			? `Verdict: ${report.verdict === 'supported' ? 'Supported' : 'Not supported'}`
			: 'Not evaluated'
	);
	doc.setCreator('Brothwright');
	const { font, bold } = await embedLexend(doc);
	const w = new Writer(doc, font, bold);

	writeHeading(w, loaded, printedAt);
	writeWhatItUses(w, loaded);
	if (!report) {
		w.text(`This study cannot be evaluated: ${loaded.reportError ?? 'unknown reason'}`, {
			bold: true,
			color: CAUTION_COLOR
		});
	} else {
		writeVerdict(w, report);
		writeTimeCourse(w, report, study.durationH);
		writeNutrients(w, report);
		writeOxygen(w, report);
		writeHeat(w, report);
		writeVolume(w, report);
		writeDefaults(w, report);
	}
	stampPageFooters(doc, font, {
		left: `Sufficiency study: ${study.name}`,
		middle: `Printed ${formatDateTime(printedAt, siteTimeZone())}`
	});
	return doc.save();
}

function writeHeading(w: Writer, { study, report }: LoadedStudyReport, printedAt: Date): void {
	w.text('Brothwright sufficiency study · Pilot Plant North', { size: 8 });
	w.text(study.name, { size: 18, bold: true });
	w.text(
		`Printed ${formatDateTime(printedAt, siteTimeZone())} · target ${formatAmount(study.targetValue)} ${TARGET_BASIS_UNITS[study.targetBasis]} · safety factor ${study.safetyFactor}`
	);
	w.gap(10);

	w.heading('Safety cautions', { color: CAUTION_COLOR });
	for (const caution of report?.cautions ?? studyCautions(study.o2MoleFraction))
		w.text(`- ${caution}`, { x: MARGIN + 8, color: CAUTION_COLOR });
	w.gap(10);
}

function writeWhatItUses(w: Writer, loaded: LoadedStudyReport): void {
	const { study } = loaded;
	w.heading('What it uses');
	w.text(`Basal: ${describeVersion(loaded.basal)}`);
	w.text(
		`Feeds: ${loaded.feeds.length ? loaded.feeds.map((f) => `${describeVersion(f)}: ${f.planText}`).join('; ') : 'none (batch)'}`
	);
	w.text(`Organism: ${loaded.profile.name}`);
	w.text(`Vessel: ${loaded.vessel.name}`);
	w.text(`Target: ${formatAmount(study.targetValue)} ${TARGET_BASIS_UNITS[study.targetBasis]}`);
	w.text(`Plan: run ${study.durationH} h, ${study.initialVolumeL} L at start`);
	w.text(
		`Conditions: ${study.temperatureC} °C, ${study.pressureKPa} kPa, O2 fraction ${study.o2MoleFraction}, DO setpoint ${study.doSetpointPercent} %`
	);
	if (study.notes) w.text(`Notes: ${study.notes}`);
	w.gap(10);
}

function writeVerdict(w: Writer, report: Report): void {
	const supported = report.verdict === 'supported';
	w.heading(`Verdict: ${supported ? 'Supported' : 'Not supported'}`, {
		size: 14,
		color: supported ? [0.1, 0.4, 0.15] : CAUTION_COLOR
	});
	const cells =
		report.limit.maxCellsPerMl !== null
			? ` (${formatCells(report.limit.maxCellsPerMl)} cells/mL)`
			: '';
	w.text(
		`Limiting: ${report.limit.name} · maximum supportable about ${formatAmount(report.limit.maxBiomassGPerL)} g/L${cells} against the target ${formatAmount(report.inputs.targetBiomassGPerL)} g/L.`
	);
	for (const reason of report.reasons) w.text(`- ${reason}`, { x: MARGIN + 8 });
	if (report.warnings.length > 0) {
		w.gap(4);
		w.heading('Watch during the run', { size: 9.5, color: CAUTION_COLOR });
		for (const warning of report.warnings)
			w.text(`- ${warning}`, { x: MARGIN + 8, color: CAUTION_COLOR });
	}
	w.gap(10);
}

const NUTRIENT_COLUMNS: TableColumn[] = [
	{ header: 'Nutrient', width: 105 },
	{ header: 'Role', width: 47 },
	{ header: 'Value is', width: 70 },
	{ header: 'Demand g/L', width: 45, align: 'right' },
	{ header: 'Supply g/L', width: 45, align: 'right' },
	{ header: 'Ratio', width: 35, align: 'right' },
	{ header: 'Margin g/L', width: 45, align: 'right' },
	{ header: 'Short from', width: 75, align: 'right' },
	{ header: 'Check', width: 48 }
];

function nutrientRows(report: Report): string[][] {
	const lines = [...report.nutrients.lines].sort((a, b) => a.ratio - b.ratio);
	return lines.map((l) => [
		l.note ? `${l.name} (${l.note})` : l.name,
		l.roleFrom === 'profile' ? `${l.role} (profile)` : l.role,
		VALUE_CONFIDENCE_WORDS[l.confidence],
		formatAmount(l.demandGPerL),
		formatAmount(l.supplyGPerL),
		formatAmount(l.ratio),
		formatAmount(l.marginGPerL),
		formatRunout(l.runout, l.noRunout),
		l.sufficient ? 'OK' : l.role === 'required' ? 'SHORT' : 'SHORT (trace)'
	]);
}

/** A section heading, its small-print explanation and a table, the heading kept with the table's start. */
function writeTableSection(
	w: Writer,
	heading: string,
	explanation: string,
	columns: TableColumn[],
	rows: string[][]
): void {
	const explanationPt = w.lines(explanation, { size: SMALL_PT }).length * (SMALL_PT + 3) + 3;
	w.heading(heading, { keepWithNextPt: explanationPt + w.tableLeadPt(columns, rows) });
	w.text(explanation, { size: SMALL_PT });
	w.gap(3);
	w.table(columns, rows);
}

function writeNutrients(w: Writer, report: Report): void {
	writeTableSection(
		w,
		`Nutrients: ${report.nutrients.check}`,
		`Demand at the target against supply, g per litre of final volume. A line is OK at supply >= ${report.inputs.safetyFactor} × demand. Only required nutrients set the limit; a short trace element is a warning.`,
		NUTRIENT_COLUMNS,
		nutrientRows(report)
	);
	const sources = listValueSources(report.nutrients.lines);
	if (sources.length > 0)
		w.text(`Sources of the values: ${sources.join('; ')}`, { size: SMALL_PT });
	for (const note of report.nutrients.notes) w.text(note, { size: SMALL_PT });
	w.gap(10);
}

function writeOxygen(w: Writer, report: Report): void {
	const o = report.oxygen;
	w.ensure(120);
	w.heading(`Oxygen: ${o.check}`);
	w.text(`Total O2 needed: ${formatAmount(o.totalO2G)} g (${formatAmount(o.totalO2Mol)} mol)`);
	const atLeast = o.lowerBound ? 'at least ' : '';
	w.text(
		`Peak OUR of the plan ${atLeast}${formatAmount(o.peakOurMmolPerLH)} mmol/(L·h) against max OTR at DO setpoint ${formatAmount(o.maxOtrMmolPerLH)} mmol/(L·h)`
	);
	w.text(
		`kLa used / needed: ${formatAmount(report.inputs.kLaPerH)} / ${atLeast}${o.kLaRecommendedPerH} 1/h`
	);
	w.text(
		`O2 fraction used / needed: ${formatAmount(report.inputs.o2MoleFraction)} / ${o.enrichmentFeasible ? `${atLeast}${o.o2MoleFractionRecommended}` : 'above 1'}${o.enrichmentAllowed ? '' : ' · enrichment not allowed'}`
	);
	w.text(`Reserve at setpoint: ${o.reserveS === null ? '—' : `${formatAmount(o.reserveS)} s`}`);
	w.text(
		`Peak OUR from ${o.peakOurOrigin}; kLa ${report.inputs.kLaOrigin}. Needed values are rounded up.${o.lowerBound ? ' The run could not cover the whole plan, so these are lower bounds.' : ''}`,
		{ size: SMALL_PT }
	);
	w.gap(10);
}

function writeHeat(w: Writer, report: Report): void {
	w.ensure(60);
	w.heading(`Heat: ${report.heat.check}`);
	w.text(
		`Heat load ${report.heat.lowerBound ? 'at least ' : ''}${formatAmount(report.heat.heatLoadW)} W (metabolic ${formatAmount(report.heat.metabolicW)} W at ${formatAmount(report.heat.heatPerMolO2KJ)} kJ/mol O2, agitation ${formatAmount(report.heat.agitationPowerW)} W) against cooling capacity ${formatAmount(report.heat.coolingCapacityW)} W: ${formatAmount(report.heat.utilisation * 100)} % used`
	);
	w.gap(10);
}

function writeVolume(w: Writer, report: Report): void {
	w.ensure(60);
	w.heading(`Volume: ${report.volume.check}`);
	w.text(
		`Final ${formatAmount(report.volume.finalL)} L (initial ${formatAmount(report.volume.initialL)} L + feeds ${formatAmount(report.volume.feedL)} L) against the vessel's maximum ${formatAmount(report.volume.maxL)} L (working range ${formatAmount(report.volume.minL)}–${formatAmount(report.volume.maxL)} L)`
	);
	for (const f of report.feeds) {
		const drawn =
			f.deliveredL === null ? '' : `, the simulated run draws ${formatAmount(f.deliveredL)} L`;
		const dry = f.emptyAtH === null ? '' : `; runs dry at ${formatAmount(f.emptyAtH)} h`;
		w.text(
			`${f.label}: ${FEED_PLAN_LABELS[f.strategy]} from ${formatAmount(f.startH)} h, ${formatAmount(f.volumeL)} L ${f.controlled ? 'available' : 'planned'}${drawn}${dry}`,
			{ size: SMALL_PT, x: MARGIN + 8 }
		);
	}
	w.gap(10);
}

function writeDefaults(w: Writer, report: Report): void {
	writeTableSection(
		w,
		'Values and defaults used',
		'Every value this study assumed, or worked out from your entries, with where it comes from.',
		[
			{ header: 'What', width: 170 },
			{ header: 'Value', width: 110 },
			{ header: 'Source', width: 235 }
		],
		report.defaults.map((d) => [d.what, d.value, d.source])
	);
	for (const note of report.notes) w.text(note, { size: SMALL_PT });
}
