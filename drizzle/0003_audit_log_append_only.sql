-- The audit trail is append-only (ISO/IEC 17025:2017 §7.5.2, §8.4.2): the database refuses every
-- UPDATE, DELETE and TRUNCATE of audit_log, whoever sends it. A database owner can still disable
-- the trigger; the hash chain (server/audit/verify.ts) shows what was changed then.
CREATE OR REPLACE FUNCTION audit_log_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'audit_log is append-only: % is not allowed', TG_OP USING ERRCODE = '42501';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER audit_log_append_only BEFORE UPDATE OR DELETE ON audit_log FOR EACH ROW EXECUTE FUNCTION audit_log_refuse_change();
--> statement-breakpoint
CREATE TRIGGER audit_log_no_truncate BEFORE TRUNCATE ON audit_log FOR EACH STATEMENT EXECUTE FUNCTION audit_log_refuse_change();
