// kLa map vocabulary shared by server and pages; no server code here.

/** How a map point's kLa was found. */
export const KLA_METHODS = ['gassingOut', 'dynamic', 'entered'] as const;
export type KlaMethod = (typeof KLA_METHODS)[number];
export const KLA_METHOD_LABELS: Record<KlaMethod, string> = {
	gassingOut: 'Gassing-out (re-aeration after nitrogen stripping)',
	dynamic: 'Dynamic method during a run (gas off, then on)',
	entered: 'Entered (measured elsewhere)'
};

/** Where a map point's P/V comes from. */
export const KLA_POWER_SOURCES = ['measured', 'powerNumber'] as const;
export type KlaPowerSource = (typeof KLA_POWER_SOURCES)[number];
export const KLA_POWER_SOURCE_LABELS: Record<KlaPowerSource, string> = {
	measured: 'measured',
	powerNumber: 'from the power number'
};
