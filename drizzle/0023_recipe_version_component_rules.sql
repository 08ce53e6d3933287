-- Versions already in review, approved or retired keep the library as it stands today.
INSERT INTO recipe_version_component (version_id, component_id, component_revision, data)
SELECT DISTINCT v.id, c.id, c.revision, json_object(
		'id', c.id,
		'name', c.name,
		'category', c.category,
		'formula', c.formula,
		'molarMassGPerMol', c.molar_mass_g_per_mol,
		'casNumber', c.cas_number,
		'elementalMassFractions', json(c.elemental_mass_fractions),
		'fractionsNote', c.fractions_note,
		'ions', json(c.ions),
		'osmoticCoefficient', c.osmotic_coefficient,
		'osmoticCoefficientSource', c.osmotic_coefficient_source,
		'solubility', json(c.solubility),
		'ghsHazards', json(c.ghs_hazards),
		'hazardSource', c.hazard_source,
		'storage', c.storage,
		'basisComponentId', c.basis_component_id,
		'synonyms', json(c.synonyms),
		'fromReference', json(CASE WHEN c.from_reference THEN 'true' ELSE 'false' END),
		'reorderLevelG', c.reorder_level_g,
		'densityGPerMl', c.density_g_per_ml,
		'revision', c.revision,
		'createdAt', strftime('%Y-%m-%dT%H:%M:%fZ', c.created_at / 1000.0, 'unixepoch'),
		'updatedAt', strftime('%Y-%m-%dT%H:%M:%fZ', c.updated_at / 1000.0, 'unixepoch')
	)
FROM recipe_version v
JOIN recipe_line l ON l.version_id = v.id
JOIN component c ON c.id IN (l.component_id, l.shelf_form_id)
WHERE v.status IN ('in_review', 'approved', 'retired');
--> statement-breakpoint
-- A version's component snapshot is taken when it is submitted and kept from then on; only a
-- version returned to draft drops it (and takes a new one when submitted again).
CREATE TRIGGER recipe_version_component_no_update BEFORE UPDATE ON recipe_version_component
BEGIN
	SELECT RAISE(ABORT, 'recipe_version_component: a snapshot cannot change');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_version_component_kept BEFORE DELETE ON recipe_version_component
WHEN (SELECT status FROM recipe_version WHERE id = OLD.version_id) <> 'draft'
BEGIN
	SELECT RAISE(ABORT, 'recipe_version_component: the snapshot of a version in review or approved is kept');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_version_component_taken BEFORE INSERT ON recipe_version_component
WHEN (SELECT status FROM recipe_version WHERE id = NEW.version_id) IN ('approved', 'retired')
BEGIN
	SELECT RAISE(ABORT, 'recipe_version_component: the snapshot of an approved version is complete');
END;
