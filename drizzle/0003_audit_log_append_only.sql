-- The audit log is evidence of who saw or changed a patient's record: like the event log it is
-- append-only in the database itself. Row triggers refuse UPDATE and DELETE; a statement trigger
-- refuses TRUNCATE. Purging entries past the retention period is a deliberate act for a database
-- administrator under local policy (disable the trigger in a reviewed maintenance step), never app code.
CREATE OR REPLACE FUNCTION ledgerline_audit_append_only() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'audit_log is append-only: % is refused', TG_OP
    USING ERRCODE = 'P0001';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER audit_log_refuse_update_delete
  BEFORE UPDATE OR DELETE ON audit_log
  FOR EACH ROW EXECUTE FUNCTION ledgerline_audit_append_only();
--> statement-breakpoint
CREATE TRIGGER audit_log_refuse_truncate
  BEFORE TRUNCATE ON audit_log
  FOR EACH STATEMENT EXECUTE FUNCTION ledgerline_audit_append_only();
