/**
 * Frozen records (issue 8): released template versions and issued certificates are protected by
 * database triggers, whoever sends the statement — tested here with raw SQL that bypasses the API.
 * Sources: ISO/IEC 17025:2017 §7.2.2 (a validated method is used as validated), §7.8.8 (an issued
 * certificate is changed only by a new, uniquely identified one), §7.5 and §8.4 (records protected
 * against unauthorised change); migrations 0005_template_versions_frozen, 0010_certificates_frozen.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../setup/test-app';
import { approve, submittedJob } from '../certificates-helpers';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
}, 240_000);
afterAll(() => t?.close());

const refused = /frozen|cannot be deleted|never deleted|is final|that is final|may only change/;
const row = async (table: string, id: string) => JSON.stringify((await t.database.query(`select * from ${table} where id = $1`, [id]))[0]);

describe('released template versions', () => {
  let id: string;
  beforeAll(async () => {
    const [v] = await t.database.query<{ id: string }>(`select id from template_versions where status = 'released' order by created_at limit 1`);
    id = v.id;
  });

  const changes: Array<[string, string]> = [
    ['definition', `definition = definition || '{"note": "edited"}'::jsonb`],
    ['version', 'version = version + 100'],
    ['template_id', 'template_id = (select id from templates where id <> template_versions.template_id limit 1)'],
    ['validation', `validation = '{}'::jsonb`],
    ['released_by', 'released_by = null'],
    ['released_at', `released_at = released_at + interval '1 day'`],
    ['created_by', 'created_by = null'],
    ['created_at', `created_at = created_at - interval '1 day'`],
    ['status back to draft', `status = 'draft'`],
  ];
  for (const [what, set] of changes) {
    it(`when raw SQL changes ${what}, then the trigger refuses and the row is unchanged`, async () => {
      const before = await row('template_versions', id);
      await expect(t.database.query(`update template_versions set ${set} where id = $1`, [id])).rejects.toThrow(refused);
      expect(await row('template_versions', id)).toBe(before);
    });
  }

  it('when raw SQL deletes it, then the trigger refuses', async () => {
    await expect(t.database.query('delete from template_versions where id = $1', [id])).rejects.toThrow(refused);
    expect(await row('template_versions', id)).toBeDefined();
  });

  it('when it is retired, then only that status change passes and retired is final', async () => {
    const [v] = await t.database.query<{ id: string }>(`select id from template_versions where status = 'released' and id <> $1 order by created_at desc limit 1`, [id]);
    await t.database.query(`update template_versions set status = 'retired', retired_at = now() where id = $1`, [v.id]);
    await expect(t.database.query(`update template_versions set status = 'released' where id = $1`, [v.id])).rejects.toThrow(refused);
    await expect(t.database.query(`update template_versions set retired_at = now() + interval '1 day' where id = $1`, [v.id])).rejects.toThrow(refused);
  });
});

describe('issued certificates', () => {
  let id: string;
  beforeAll(async () => {
    const job = await submittedJob(t);
    id = (await approve(t, job.jobId)).id;
  }, 240_000);

  const changes: Array<[string, string]> = [
    ['number', `number = number || '-X'`],
    ['job_id', 'job_id = null'],
    ['customer_id', 'customer_id = (select id from customers where id <> certificates.customer_id limit 1)'],
    ['data', `data = data || '{"edited": true}'::jsonb`],
    ['pdf', `pdf = '\\x25504446'::bytea`],
    ['pdf_sha256', `pdf_sha256 = repeat('0', 64)`],
    ['pdf_size', 'pdf_size = pdf_size + 1'],
    ['signing_fingerprint', `signing_fingerprint = 'forged'`],
    ['issued_at', `issued_at = issued_at - interval '1 day'`],
    ['signatory_id', 'signatory_id = null'],
    ['signatory_name', `signatory_name = 'Someone Else'`],
    ['amend_reason', `amend_reason = 'rewritten'`],
    ['status to draft-like value', `status = 'draft'`],
  ];
  for (const [what, set] of changes) {
    it(`when raw SQL changes ${what}, then the trigger refuses and the row is unchanged`, async () => {
      const before = await row('certificates', id);
      await expect(t.database.query(`update certificates set ${set} where id = $1`, [id])).rejects.toThrow(refused);
      expect(await row('certificates', id)).toBe(before);
    });
  }

  it('when raw SQL deletes or truncates, then the trigger refuses', async () => {
    await expect(t.database.query('delete from certificates where id = $1', [id])).rejects.toThrow(refused);
    await expect(t.database.query('truncate certificates cascade')).rejects.toThrow(refused);
    expect(await row('certificates', id)).toBeDefined();
  });

  it('when it is withdrawn, then that passes once and withdrawn is final', async () => {
    await t.database.query(`update certificates set status = 'withdrawn', withdrawn_at = now(), withdrawn_reason = 'test' where id = $1`, [id]);
    await expect(t.database.query(`update certificates set status = 'current' where id = $1`, [id])).rejects.toThrow(refused);
    await expect(t.database.query(`update certificates set withdrawn_reason = 'changed' where id = $1`, [id])).rejects.toThrow(refused);
  });
});
