import { useCallback, useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { TEMPLATE_STATUS_LABELS, type TemplateDefinition, type TemplateVersion } from '../../../../shared/schemas/template.schema';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useTemplates } from '../api/get-templates';
import { useUpdateDraft } from '../api/update-draft';
import { useNewVersionFrom, useReleaseVersion, useRetireVersion, useValidateVersion } from '../api/version-actions';
import { ReleaseDialog } from './release-dialog';
import { StatusText } from './status-text';
import { TEMPLATE_FORM_ID, TemplateEditor } from './template-editor';
import { ValidationReport } from './validation-report';
import { formatDateTimeUtc } from '../../../../shared/format/date';

/** One version: the editor for a draft, the same form read-only for a released or retired one. */
export function TemplateVersionView({ version, canEdit }: { version: TemplateVersion; canEdit: boolean }) {
  const navigate = useNavigate();
  const editable = canEdit && version.status === 'draft';
  const save = useUpdateDraft(version.id);
  const check = useValidateVersion(version.id);
  const release = useReleaseVersion(version.id);
  const newVersion = useNewVersionFrom(version.id);
  const retire = useRetireVersion(version.id);
  const [dirty, setDirty] = useState(false);
  const [confirmRelease, setConfirmRelease] = useState(false);
  const [confirmRetire, setConfirmRetire] = useState(false);
  const onDirtyChange = useCallback((d: boolean) => setDirty(d), []);
  const siblings = useTemplates().data?.find((t) => t.id === version.templateId)?.versions ?? [];

  const actionError = [save.error, check.error, release.error, newVersion.error, retire.error].find(Boolean) as ApiError | Error | undefined;
  const record = version.validation;

  async function onSave(d: TemplateDefinition) {
    check.reset();
    release.reset();
    await save.mutateAsync(d).catch(() => undefined);
  }

  return (
    <div className="min-w-0 space-y-4">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-sm text-ink-muted"><Link to="/app/templates">Measurement models</Link> /</p>
          <h1 className="text-2xl font-semibold text-ink">{version.definition.name}</h1>
          <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-muted">
            <span className="font-semibold text-ink">Version {version.version}</span>
            <StatusText status={version.status} />
            {version.releasedAt && <span>released {formatDateTimeUtc(version.releasedAt)}{version.releasedBy ? ` by ${version.releasedBy.name}` : ''}</span>}
            {version.retiredAt && <span>· retired {formatDateTimeUtc(version.retiredAt)}</span>}
            {version.status === 'draft' && <span>last saved {formatDateTimeUtc(version.updatedAt)}{version.updatedBy ? ` by ${version.updatedBy.name}` : ''}</span>}
          </p>
          {siblings.length > 1 && (
            <nav aria-label="Versions" className="mt-1 flex flex-wrap gap-2 text-xs">
              {siblings.map((s) => s.id === version.id ? (
                <span key={s.id} className="font-semibold">v{s.version} {TEMPLATE_STATUS_LABELS[s.status].toLowerCase()}</span>
              ) : (
                <Link key={s.id} to={`/app/templates/versions/${s.id}`}>v{s.version} {TEMPLATE_STATUS_LABELS[s.status].toLowerCase()}</Link>
              ))}
            </nav>
          )}
        </div>
        {canEdit && (
          <div className="flex flex-wrap gap-2">
            {version.status === 'draft' && (
              <>
                <Button type="submit" form={TEMPLATE_FORM_ID} variant={dirty ? 'primary' : 'secondary'} disabled={save.isPending}>
                  {save.isPending ? 'Saving…' : 'Save draft'}
                </Button>
                <Button variant="secondary" disabled={dirty || check.isPending} onClick={() => check.mutate()} title={dirty ? 'Save the draft first' : undefined}>
                  {check.isPending ? 'Checking…' : 'Check the model'}
                </Button>
                <Button variant={dirty ? 'secondary' : 'primary'} disabled={dirty} onClick={() => setConfirmRelease(true)} title={dirty ? 'Save the draft first' : undefined}>Release…</Button>
              </>
            )}
            {version.status !== 'draft' && (
              <Button
                variant={version.status === 'released' ? 'primary' : 'secondary'}
                disabled={newVersion.isPending}
                onClick={async () => {
                  const v = await newVersion.mutateAsync().catch(() => null);
                  if (v) navigate(`/app/templates/versions/${v.id}`);
                }}
              >
                New version
              </Button>
            )}
            {version.status === 'released' && <Button variant="secondary" onClick={() => setConfirmRetire(true)}>Retire…</Button>}
          </div>
        )}
      </div>

      {dirty && version.status === 'draft' && <p className="text-sm text-ink-muted">Save the draft to check or release it.</p>}
      {version.status === 'released' && (
        <Notice tone="info" label="Released: this version is frozen">
          It is used as it stands for calibration jobs. To change the model, make a new version from it; the new version starts as a draft.
        </Notice>
      )}
      {version.status === 'retired' && (
        <Notice tone="info" label="Retired">New jobs cannot choose this version; jobs that already use it keep it.</Notice>
      )}
      {confirmRetire && (
        <Notice tone="warn" label={`Retire version ${version.version}?`} role="alert">
          <p>New jobs will no longer be able to choose it. Jobs that already use it keep it, and it cannot be released again.</p>
          <div className="mt-2 flex gap-2">
            <Button onClick={async () => { await retire.mutateAsync().catch(() => undefined); setConfirmRetire(false); }}>Retire version {version.version}</Button>
            <Button variant="secondary" onClick={() => setConfirmRetire(false)}>Cancel</Button>
          </div>
        </Notice>
      )}
      {actionError && (
        <Notice tone="danger" label={actionError instanceof ApiError && actionError.status === 422 ? 'Not released' : 'That did not work'} role="alert">
          {actionError.message}
        </Notice>
      )}
      {save.isSuccess && !dirty && !actionError && version.status === 'draft' && <p className="text-sm text-ok" role="status">Draft saved.</p>}
      {record && <ValidationReport record={record} />}

      <TemplateEditor definition={version.definition} readOnly={!editable} saving={save.isPending} onSave={onSave} onDirtyChange={onDirtyChange} />

      <ReleaseDialog
        open={confirmRelease}
        name={version.definition.name}
        version={version.version}
        busy={release.isPending}
        onCancel={() => setConfirmRelease(false)}
        onConfirm={async () => {
          await release.mutateAsync().catch(() => undefined);
          setConfirmRelease(false);
        }}
      />
    </div>
  );
}
