-- The event log is append-only in the database itself (PRODUCT.md, Sync and offline promises):
-- corrections are new `void` and `amend` events, never edits. Row triggers refuse UPDATE and DELETE,
-- a statement trigger refuses TRUNCATE (row triggers do not fire on it).
CREATE OR REPLACE FUNCTION ledgerline_events_append_only() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'events is append-only: % is refused', TG_OP
    USING ERRCODE = 'P0001',
          HINT = 'Record a correction as a new void or amend event.';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER events_refuse_update_delete
  BEFORE UPDATE OR DELETE ON events
  FOR EACH ROW EXECUTE FUNCTION ledgerline_events_append_only();
--> statement-breakpoint
CREATE TRIGGER events_refuse_truncate
  BEFORE TRUNCATE ON events
  FOR EACH STATEMENT EXECUTE FUNCTION ledgerline_events_append_only();
