-- Who changed a recipe version is part of the data, whatever route changed it: the author at
-- creation, and whoever saves a new revision. Nobody listed may sign the version.
INSERT OR IGNORE INTO recipe_version_editor (version_id, user_id)
SELECT id, author_id FROM recipe_version;
--> statement-breakpoint
INSERT OR IGNORE INTO recipe_version_editor (version_id, user_id)
SELECT id, updated_by_id FROM recipe_version WHERE updated_by_id IS NOT NULL;
--> statement-breakpoint
INSERT OR IGNORE INTO recipe_version_editor (version_id, user_id)
SELECT a.subject_id, a.actor_id FROM audit_event a
WHERE a.subject_type = 'recipe_version' AND a.actor_id IS NOT NULL
	AND a.action IN ('recipe.draft_saved', 'recipe.lines_imported', 'recipe.draft_started')
	AND EXISTS (SELECT 1 FROM recipe_version v WHERE v.id = a.subject_id)
	AND EXISTS (SELECT 1 FROM user u WHERE u.id = a.actor_id);
--> statement-breakpoint
CREATE TRIGGER recipe_version_editor_at_creation AFTER INSERT ON recipe_version
BEGIN
	INSERT OR IGNORE INTO recipe_version_editor (version_id, user_id) VALUES (NEW.id, NEW.author_id);
	INSERT OR IGNORE INTO recipe_version_editor (version_id, user_id)
	SELECT NEW.id, NEW.updated_by_id WHERE NEW.updated_by_id IS NOT NULL;
END;
--> statement-breakpoint
CREATE TRIGGER recipe_version_editor_at_change AFTER UPDATE OF revision, updated_by_id ON recipe_version
WHEN NEW.updated_by_id IS NOT NULL
BEGIN
	INSERT OR IGNORE INTO recipe_version_editor (version_id, user_id) VALUES (NEW.id, NEW.updated_by_id);
END;
--> statement-breakpoint
CREATE TRIGGER recipe_version_editor_no_update BEFORE UPDATE ON recipe_version_editor
BEGIN
	SELECT RAISE(ABORT, 'recipe_version_editor is append-only: UPDATE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER recipe_version_editor_no_delete BEFORE DELETE ON recipe_version_editor
BEGIN
	SELECT RAISE(ABORT, 'recipe_version_editor is append-only: DELETE is refused');
END;
--> statement-breakpoint
CREATE TRIGGER e_signature_not_by_editor BEFORE INSERT ON e_signature
WHEN NEW.subject_type = 'recipe_version'
	AND EXISTS (
		SELECT 1 FROM recipe_version_editor
		WHERE version_id = NEW.subject_id AND user_id = NEW.signer_id
	)
BEGIN
	SELECT RAISE(ABORT, 'e_signature: whoever changed a recipe version may not sign it');
END;
