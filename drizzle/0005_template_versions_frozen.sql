-- A released template version is frozen (ISO/IEC 17025:2017 §7.2.2 and §8.3: a validated method
-- is used as validated). The database refuses, whoever sends the statement:
--  * any change of a released or retired version's definition, number, template, validation
--    record, creation or release columns;
--  * any status change other than released → retired (retired is final);
--  * deleting a released or retired version (jobs may refer to it).
-- Drafts stay freely editable. The API answers 409 before it gets this far.
CREATE OR REPLACE FUNCTION template_versions_guard() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    IF OLD.status <> 'draft' THEN
      RAISE EXCEPTION 'template version % (v%) is %: it cannot be deleted', OLD.id, OLD.version, OLD.status USING ERRCODE = '42501';
    END IF;
    RETURN OLD;
  END IF;
  IF OLD.status = 'draft' THEN
    RETURN NEW;
  END IF;
  IF NEW.definition IS DISTINCT FROM OLD.definition
     OR NEW.version IS DISTINCT FROM OLD.version
     OR NEW.template_id IS DISTINCT FROM OLD.template_id
     OR NEW.validation IS DISTINCT FROM OLD.validation
     OR NEW.released_by IS DISTINCT FROM OLD.released_by
     OR NEW.released_at IS DISTINCT FROM OLD.released_at
     OR NEW.created_by IS DISTINCT FROM OLD.created_by
     OR NEW.created_at IS DISTINCT FROM OLD.created_at THEN
    RAISE EXCEPTION 'template version % (v%) is %: its definition, number, validation and release record are frozen', OLD.id, OLD.version, OLD.status USING ERRCODE = '42501';
  END IF;
  IF NEW.status IS DISTINCT FROM OLD.status AND NOT (OLD.status = 'released' AND NEW.status = 'retired') THEN
    RAISE EXCEPTION 'template version % (v%): status may only change from released to retired, not from % to %', OLD.id, OLD.version, OLD.status, NEW.status USING ERRCODE = '42501';
  END IF;
  IF OLD.status = 'retired' AND NEW.retired_at IS DISTINCT FROM OLD.retired_at THEN
    RAISE EXCEPTION 'template version % (v%) is retired: its retirement date is frozen', OLD.id, OLD.version USING ERRCODE = '42501';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER template_versions_frozen BEFORE UPDATE OR DELETE ON template_versions FOR EACH ROW EXECUTE FUNCTION template_versions_guard();
