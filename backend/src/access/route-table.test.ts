import express, { Router } from 'express';
import { allow } from './access-policy';
import { assertEveryRouteDeclaresAPolicy, listRoutes } from './route-table';

describe('the route table walk', () => {
  it('finds routes of mounted routers with their full path and their policy', () => {
    const app = express();
    const api = Router();
    api.get('/inspections', allow.to('view'), (_req, res) => res.end());
    api.post('/inspections', (_req, res) => res.end());
    app.use('/api', api);
    app.get('/auth/saml/metadata', allow.public, (_req, res) => res.end());

    expect(listRoutes(app)).toEqual([
      { method: 'GET', path: '/api/inspections', policy: expect.stringMatching(/^view the map/) },
      { method: 'POST', path: '/api/inspections', policy: null },
      { method: 'GET', path: '/auth/saml/metadata', policy: 'anyone' },
    ]);
    expect(() => assertEveryRouteDeclaresAPolicy(app)).toThrow('Routes without an access policy: POST /api/inspections');
  });

  it('does not count a policy that is not the first handler', () => {
    const app = express();
    app.get('/late', (_req, _res, next) => next(), allow.signedIn, (_req, res) => res.end());
    expect(listRoutes(app)).toEqual([{ method: 'GET', path: '/late', policy: null }]);
  });
});
