// Class sets used across the product, kept in one place so the look changes in one place.
export type ButtonKind = 'primary' | 'secondary' | 'danger' | 'quiet';

const buttonBase =
	'inline-flex min-h-10 items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed disabled:opacity-50 no-underline hover:no-underline';

const buttonKinds: Record<ButtonKind, string> = {
	primary: 'bg-kelp-700 text-white hover:bg-kelp-800 active:bg-kelp-900',
	secondary: 'border border-oat-300 bg-white text-kelp-800 hover:bg-oat-100',
	danger: 'bg-halt-600 text-white hover:bg-halt-800',
	quiet: 'text-kelp-700 hover:bg-kelp-50'
};

export function buttonClass(kind: ButtonKind = 'primary', extra = ''): string {
	return [buttonBase, buttonKinds[kind], extra].filter(Boolean).join(' ');
}

export const inputClass =
	'block w-full rounded-md border border-oat-300 bg-white px-3 py-2 text-base text-oat-900 shadow-inner placeholder:text-oat-400 focus:border-kelp-500 focus:outline-none focus:ring-2 focus:ring-kelp-200 aria-[invalid=true]:border-halt-600 aria-[invalid=true]:ring-halt-50';

export const cardClass = 'rounded-card border border-oat-200 bg-white p-gutter shadow-card';

export type NoticeKind = 'info' | 'ok' | 'caution' | 'halt';

export const noticeClass: Record<NoticeKind, string> = {
	info: 'border-kelp-200 bg-kelp-50 text-kelp-900',
	ok: 'border-ok-600/30 bg-ok-50 text-ok-800',
	caution: 'border-caution-600/30 bg-caution-50 text-caution-800',
	halt: 'border-halt-600/30 bg-halt-50 text-halt-800'
};

export const badgeClass = 'inline-block rounded px-2 py-0.5 text-xs font-medium whitespace-nowrap';

export const statusBadgeClass: Record<'draft' | 'in_review' | 'approved' | 'retired', string> = {
	draft: 'bg-oat-100 text-oat-800',
	in_review: 'bg-caution-50 text-caution-800',
	approved: 'bg-ok-50 text-ok-800',
	retired: 'bg-halt-50 text-halt-800'
};

export const tableClass = 'w-full text-left text-sm';
// No uppercase: headers carry units and symbols (mmol, kPa, μmax, kLa) whose case is their meaning.
export const tableHeadClass =
	'border-b border-oat-200 bg-oat-100 text-xs font-semibold tracking-wide text-oat-700';
export const tableWrapClass =
	'overflow-x-auto rounded-card border border-oat-200 bg-white shadow-card';
export const labelClass = 'mb-1 block text-sm font-medium text-kelp-900';
export const errorTextClass = 'text-sm text-halt-600';
