import { useParams } from 'react-router';
import { TemplateList } from '../../features/templates/components/template-list';
import { TemplateVersionView } from '../../features/templates/components/template-version-view';
import { useTemplateVersion } from '../../features/templates/api/get-template-version';
import { useMe } from '../../features/session/api/get-me';
import { Notice } from '../../components/ui/notice';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';
import { PageHeader } from './page-header';
import { PLACEHOLDERS } from './section-placeholders';

/** /app/templates: the list of measurement models. */
export function TemplatesPage() {
  const { user } = useMe();
  const section = SECTIONS.templates;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  return (
    <>
      <title>{`${section.label} · Emberline`}</title>
      <PageHeader title={section.label}>{PLACEHOLDERS.templates.intro}</PageHeader>
      <TemplateList canEdit={user.role === 'quality_manager'} />
    </>
  );
}

/** /app/templates/versions/:versionId: one version, editable while it is a draft. */
export function TemplateVersionPage() {
  const { user } = useMe();
  const { versionId = '' } = useParams();
  const q = useTemplateVersion(versionId);
  const section = SECTIONS.templates;
  if (!user.role || !canOpen(section, user.role)) return <ForbiddenPage what={section.label} />;
  if (q.isPending) return <p className="text-sm text-ink-muted" role="status">Loading the model…</p>;
  if (q.isError && q.data === undefined) return <Notice tone="danger" label="This model could not be loaded" role="alert">{q.error.message}</Notice>;
  return (
    <>
      <title>{`${q.data.definition.name} v${q.data.version} · Emberline`}</title>
      <TemplateVersionView key={q.data.id} version={q.data} canEdit={user.role === 'quality_manager'} />
    </>
  );
}
