-- An issued calibration certificate is never changed or removed (ISO/IEC 17025:2017 §7.8.8: a
-- change is made only by a new, uniquely identified certificate that names the one it replaces).
-- The database refuses, whoever sends the statement:
--  * any change of a certificate's number, job, customer, frozen data, PDF bytes, PDF hash and
--    size, signing fingerprint, issue time, signatory or amendment link;
--  * any status change other than current → superseded (with the superseding certificate) or
--    current → withdrawn; superseded and withdrawn are final;
--  * DELETE and TRUNCATE.
CREATE OR REPLACE FUNCTION certificates_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' OR TG_OP = 'TRUNCATE' THEN
    RAISE EXCEPTION 'issued certificates are never deleted: % is not allowed', TG_OP USING ERRCODE = '42501';
  END IF;
  IF NEW.number IS DISTINCT FROM OLD.number
     OR NEW.job_id IS DISTINCT FROM OLD.job_id
     OR NEW.customer_id IS DISTINCT FROM OLD.customer_id
     OR NEW.data IS DISTINCT FROM OLD.data
     OR NEW.pdf IS DISTINCT FROM OLD.pdf
     OR NEW.pdf_sha256 IS DISTINCT FROM OLD.pdf_sha256
     OR NEW.pdf_size IS DISTINCT FROM OLD.pdf_size
     OR NEW.signing_fingerprint IS DISTINCT FROM OLD.signing_fingerprint
     OR NEW.issued_at IS DISTINCT FROM OLD.issued_at
     OR NEW.signatory_id IS DISTINCT FROM OLD.signatory_id
     OR NEW.signatory_name IS DISTINCT FROM OLD.signatory_name
     OR NEW.amends_id IS DISTINCT FROM OLD.amends_id
     OR NEW.amend_reason IS DISTINCT FROM OLD.amend_reason THEN
    RAISE EXCEPTION 'certificate % is issued: its number, data, PDF, hash and issue record are frozen', OLD.number USING ERRCODE = '42501';
  END IF;
  IF OLD.status <> 'current' AND (NEW.status IS DISTINCT FROM OLD.status
     OR NEW.superseded_by_id IS DISTINCT FROM OLD.superseded_by_id
     OR NEW.superseded_at IS DISTINCT FROM OLD.superseded_at
     OR NEW.withdrawn_at IS DISTINCT FROM OLD.withdrawn_at
     OR NEW.withdrawn_reason IS DISTINCT FROM OLD.withdrawn_reason) THEN
    RAISE EXCEPTION 'certificate % is %: that is final', OLD.number, OLD.status USING ERRCODE = '42501';
  END IF;
  IF NEW.status IS DISTINCT FROM OLD.status AND NOT (OLD.status = 'current' AND NEW.status IN ('superseded', 'withdrawn')) THEN
    RAISE EXCEPTION 'certificate %: status may only change from current to superseded or withdrawn, not from % to %', OLD.number, OLD.status, NEW.status USING ERRCODE = '42501';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER certificates_frozen BEFORE UPDATE OR DELETE ON certificates FOR EACH ROW EXECUTE FUNCTION certificates_guard();
--> statement-breakpoint
CREATE TRIGGER certificates_no_truncate BEFORE TRUNCATE ON certificates FOR EACH STATEMENT EXECUTE FUNCTION certificates_guard();
