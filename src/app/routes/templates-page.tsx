import { TemplateList } from '../../features/templates/components/template-list';
import { useMe } from '../../features/session/api/get-me';
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
