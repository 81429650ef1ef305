import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatToolbarHarness } from '@angular/material/toolbar/testing';
import { provideRouter } from '@angular/router';
import type { SignedInUser } from '@spanledger/shared';

import { App } from './app';
import { SessionStore } from './session/session.store';

const RATER: SignedInUser = { id: 7, email: 'r@example.org', displayName: 'Priya Halloran', role: 'rater', districts: ['Central District'], admin: false };
const INSPECTOR: SignedInUser = { id: 3, email: 'i@example.org', displayName: 'Dana Whitcombe', role: 'inspector', districts: ['North District'], admin: false };
const MANAGER: SignedInUser = { id: 11, email: 'm@example.org', displayName: 'Greer Ashdown', role: 'manager', districts: [], admin: false };

describe('App shell', () => {
  async function toolbarText(answer: (server: HttpTestingController) => void): Promise<string[]> {
    TestBed.configureTestingModule({ imports: [App], providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    const fixture = TestBed.createComponent(App);
    const loaded = TestBed.inject(SessionStore).load();
    answer(TestBed.inject(HttpTestingController));
    await loaded;
    return TestbedHarnessEnvironment.loader(fixture).getHarness(MatToolbarHarness).then((toolbar) => toolbar.getRowsAsText());
  }

  it('shows only the product name to a visitor', async () => {
    const rows = await toolbarText((server) => server.expectOne('api/session').flush({ user: null }));
    expect(rows).toEqual([expect.stringMatching(/Spanledger$/)]);
  });

  it("shows the signed-in user's name, role and districts, and only the pages their role opens", async () => {
    const rows = await toolbarText((server) => server.expectOne('api/session').flush({ user: RATER }));
    expect(rows[0]).toContain('Priya Halloran');
    expect(rows[0]).toContain('Rating engineer · Central District');
    expect(rows[0]).toContain('What my role can do');
    expect(rows[0]).toContain('Ratings to review');
    expect(rows[0]).not.toContain('Network register');
  });

  it('leaves the ratings to review out for a role that reviews no ratings', async () => {
    const rows = await toolbarText((server) => server.expectOne('api/session').flush({ user: INSPECTOR }));
    expect(rows[0]).toContain('Dana Whitcombe');
    expect(rows[0]).not.toContain('Ratings to review');
  });

  // The permission matrix gives every role a template to import: inspectors findings, raters and managers the inventory.
  it.each([
    ['an inspector', INSPECTOR],
    ['a rating engineer', RATER],
    ['a manager', MANAGER],
  ])('links the imports for %s, who may import some template', async (_who, user) => {
    TestBed.configureTestingModule({ imports: [App], providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    const fixture = TestBed.createComponent(App);
    const loaded = TestBed.inject(SessionStore).load();
    TestBed.inject(HttpTestingController).expectOne('api/session').flush({ user });
    await loaded;
    await fixture.whenStable();

    const link = fixture.nativeElement.querySelector('[data-testid="nav-imports"]') as HTMLAnchorElement | null;
    expect(link?.textContent?.trim()).toBe('Imports');
    expect(link?.getAttribute('href')).toBe('/imports');
  });

  it('leaves the imports out for a visitor', async () => {
    const rows = await toolbarText((server) => server.expectOne('api/session').flush({ user: null }));
    expect(rows[0]).not.toContain('Imports');
  });

  it('offers the units switch to a signed-in user only', async () => {
    TestBed.configureTestingModule({ imports: [App], providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    const fixture = TestBed.createComponent(App);
    const loaded = TestBed.inject(SessionStore).load();
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="units-switch"]')).toBeNull();

    TestBed.inject(HttpTestingController).expectOne('api/session').flush({ user: RATER });
    await loaded;
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[data-testid="units-switch"]')).not.toBeNull();
  });
});
