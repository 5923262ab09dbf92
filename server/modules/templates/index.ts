export { createTemplatesService, getVersionForJob, listReleasedForNewJobs, type TemplatesService, type VersionForJob, type ReleasedVersionForJobs } from './templates.service';
export { createTemplatesRepository, type TemplatesRepository } from './templates.repository';
export { validateTemplate } from './template-validation';
export { templatesRoutes } from './templates.routes';
export { loadShippedTemplates, seedShippedTemplates } from './shipped-templates';
