import { Router } from 'express';
import { z } from 'zod';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import { approveBodySchema, rejectBodySchema, reviewSettingsSchema } from '../../../shared/schemas/certificates-api.schema';
import type { ReviewService } from './review.service';

const jobParams = z.object({ jobId: z.string().min(1).max(100) });

/** /api/review: the signatory's queue, the review page, reject, approve (signs and issues), the review settings. */
export function reviewRoutes(review: ReviewService): Router {
  const r = Router();
  r.get('/queue', requireRole('signatory', 'quality_manager'), async (_req, res) => {
    res.json({ jobs: await review.queue() });
  });
  r.get('/settings', requireRole('signatory', 'quality_manager', 'admin'), async (_req, res) => {
    res.json(await review.settings());
  });
  r.put('/settings', requireRole('admin'), validate({ body: reviewSettingsSchema }), async (req, res) => {
    res.json(await review.saveSettings(req.body, currentUser(res)));
  });
  r.get('/jobs/:jobId', requireRole('signatory', 'quality_manager'), validate({ params: jobParams }), async (req, res) => {
    res.json(await review.detail(String(req.params.jobId), currentUser(res)));
  });
  r.post('/jobs/:jobId/reject', requireRole('signatory'), validate({ params: jobParams, body: rejectBodySchema }), async (req, res) => {
    res.json(await review.reject(String(req.params.jobId), req.body.comment, currentUser(res)));
  });
  r.post('/jobs/:jobId/approve', requireRole('signatory'), validate({ params: jobParams, body: approveBodySchema }), async (req, res) => {
    res.status(201).json({ certificate: await review.approve(String(req.params.jobId), req.body.password, currentUser(res)) });
  });
  return r;
}
