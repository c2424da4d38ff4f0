import { Router } from 'express';
import { callerOf } from '../middleware/bearer';
import { requireSession } from '../middleware/require-session';
import { parseParams, validateBody } from '../middleware/validate';
import {
  campaignParams,
  campaignProjectParams,
  createCampaignBody,
  listCampaignResultsQuery,
  postCampaignResultBody,
  updateCampaignBody,
} from '../schemas/campaigns';
import type { CampaignService } from '../services/campaign-service';
import { parseQuery } from './views';

/** A project's test campaigns and their results; a session or the project's API token (roles in CampaignService). */
export function campaignRoutes(campaigns: CampaignService): Router {
  const router = Router();

  router.get('/projects/:projectId/campaigns', requireSession, async (req, res) => {
    const { projectId } = parseParams(campaignProjectParams, req.params);
    res.json({ campaigns: await campaigns.list(callerOf(req), projectId) });
  });

  router.post('/projects/:projectId/campaigns', requireSession, validateBody(createCampaignBody), async (req, res) => {
    const { projectId } = parseParams(campaignProjectParams, req.params);
    res.status(201).json({ campaign: await campaigns.create(callerOf(req), projectId, req.body) });
  });

  router.get('/projects/:projectId/campaigns/:campaignId', requireSession, async (req, res) => {
    const { projectId, campaignId } = parseParams(campaignParams, req.params);
    res.json({ campaign: await campaigns.get(callerOf(req), projectId, campaignId) });
  });

  router.patch('/projects/:projectId/campaigns/:campaignId', requireSession, validateBody(updateCampaignBody), async (req, res) => {
    const { projectId, campaignId } = parseParams(campaignParams, req.params);
    res.json({ campaign: await campaigns.update(callerOf(req), projectId, campaignId, req.body) });
  });

  router.post('/projects/:projectId/campaigns/:campaignId/results', requireSession, validateBody(postCampaignResultBody), async (req, res) => {
    const { projectId, campaignId } = parseParams(campaignParams, req.params);
    const { result, created } = await campaigns.postResult(callerOf(req), projectId, campaignId, req.body);
    res.status(created ? 201 : 200).json({ result });
  });

  router.get('/projects/:projectId/campaigns/:campaignId/results', requireSession, async (req, res) => {
    const { projectId, campaignId } = parseParams(campaignParams, req.params);
    const query = parseQuery(listCampaignResultsQuery, req.query);
    res.json(await campaigns.listResults(callerOf(req), projectId, campaignId, query));
  });

  return router;
}
