/**
 * /app/templates/versions/:versionId, a module of its own: the router loads it on demand
 * (./router.tsx), with the template editor, its live equation and unit checks (the engine) and
 * the GUM preview, none of which the list of models needs.
 */
import { useParams } from 'react-router';
import { Notice } from '../../components/ui/notice';
import { useTemplateVersion } from '../../features/templates/api/get-template-version';
import { TemplateVersionView } from '../../features/templates/components/template-version-view';
import { useMe } from '../../features/session/api/get-me';
import { canOpen, SECTIONS } from '../navigation';
import { ForbiddenPage } from './forbidden';

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
