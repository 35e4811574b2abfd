-- The entry -> current revision key is circular (an entry is inserted before its first
-- revision), so it is checked at commit time rather than per statement.
ALTER TABLE "entries" ADD CONSTRAINT "entries_current_revision_fk"
  FOREIGN KEY ("id", "current_revision") REFERENCES "revisions" ("entry_id", "number")
  DEFERRABLE INITIALLY DEFERRED;
