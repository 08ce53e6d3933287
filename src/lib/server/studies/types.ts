import type { StudyInputs as ScienceStudyInputs } from '$chemistry';
import type { OrganismProfileRow, VesselRow } from '../db/schema';

// The study's science types live in chemistry/study/types.ts; the app's loaded inputs carry whole rows.
export type {
	Check,
	DefaultUsed,
	FeedReport,
	NutrientRow,
	StudyFeedSource,
	StudyPlan,
	StudyReport,
	StudySource,
	SupplyComposition,
	TimeCourse,
	WhatIf
} from '$chemistry';

/** A study's inputs as loaded: the profile and vessel are the stored rows (the science reads part of them). */
export type StudyInputs = ScienceStudyInputs & { profile: OrganismProfileRow; vessel: VesselRow };

export type { OrganismProfileRow, VesselRow };
