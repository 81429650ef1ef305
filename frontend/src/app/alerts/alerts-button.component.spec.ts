import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { Router, provideRouter } from '@angular/router';

import { alertItem } from '../inspections/inspections.testing';
import { ALERTS_POLL_MS, AlertsButtonComponent } from './alerts-button.component';

@Component({ selector: 'sl-blank-page', template: '' })
class BlankPage {}

jest.setTimeout(30_000);

describe('AlertsButtonComponent', () => {
  let fixture: ComponentFixture<AlertsButtonComponent>;
  let server: HttpTestingController;

  function create(): void {
    TestBed.configureTestingModule({
      imports: [AlertsButtonComponent],
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([{ path: '**', component: BlankPage }])],
    });
    server = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(AlertsButtonComponent);
  }

  afterEach(() => {
    jest.useRealTimers();
    server.verify();
  });

  function element(testId: string): HTMLElement | null {
    return fixture.nativeElement.querySelector(`[data-testid="${testId}"]`);
  }

  const ALERTS = [
    alertItem(),
    alertItem({ id: 11, message: 'NP-0041 span 2 girder 4: broken wires in 2 strands', girderId: 9104, findingId: 605, createdAt: '2025-03-03T11:00:00.000Z' }),
    alertItem({ id: 9, message: 'NP-0017 span 1 girder 1: marked critical', structureId: 17, structureNumber: 'NP-0017', girderId: 8801, inspectionId: 70, readAt: '2025-03-01T08:00:00.000Z' }),
  ];

  it('shows how many alerts are unread, and lists them with links to the girder and the inspection', async () => {
    create();
    await fixture.whenStable();
    server.expectOne('api/alerts').flush(ALERTS);
    await fixture.whenStable();

    expect(element('alerts-count')?.textContent?.trim()).toBe('2');
    expect(element('alerts-button')?.getAttribute('aria-label')).toBe('Alerts, 2 unread');

    const menu = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatMenuHarness);
    await menu.open();
    const items = [...document.querySelectorAll('[data-testid="alert-item"]')] as HTMLElement[];
    expect(items.map((item) => item.getAttribute('data-unread'))).toEqual(['true', 'true', 'false']);
    expect(items[0]!.textContent).toContain('NP-0041 span 1 girder 2: 2 strands newly lost');
    expect(items[0]!.querySelector('[data-testid="alert-girder-link"]')?.getAttribute('href')).toBe('/girders/9002');
    expect(items[0]!.querySelector('[data-testid="alert-inspection-link"]')?.getAttribute('href')).toBe('/inspections/77');
  });

  it('marks an alert read when it is opened, and the count drops at once', async () => {
    create();
    await fixture.whenStable();
    server.expectOne('api/alerts').flush(ALERTS);
    await fixture.whenStable();
    const menu = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatMenuHarness);
    await menu.open();

    (document.querySelector('[data-alert-id="11"] [data-testid="alert-inspection-link"]') as HTMLElement).click();
    const read = server.expectOne((request) => request.method === 'POST' && request.url === 'api/alerts/11/read');
    await fixture.whenStable();
    expect(element('alerts-count')?.textContent?.trim()).toBe('1');
    read.flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    // The navigation the link started asks for the alerts again.
    server.expectOne('api/alerts').flush(ALERTS.map((alert) => (alert.id === 11 ? { ...alert, readAt: '2025-03-04T16:00:00.000Z' } : alert)));
    await fixture.whenStable();

    expect(TestBed.inject(Router).url).toBe('/inspections/77');
    expect(element('alerts-count')?.textContent?.trim()).toBe('1');
  });

  it('opening an alert already read sends nothing', async () => {
    create();
    await fixture.whenStable();
    server.expectOne('api/alerts').flush([ALERTS[2]!]);
    await fixture.whenStable();
    expect(element('alerts-count')).toBeNull();
    expect(element('alerts-button')?.getAttribute('aria-label')).toBe('Alerts, none unread');

    await (await TestbedHarnessEnvironment.loader(fixture).getHarness(MatMenuHarness)).open();
    (document.querySelector('[data-testid="alert-girder-link"]') as HTMLElement).click();
    await fixture.whenStable();
    server.expectNone((request) => request.method === 'POST');
    server.expectOne('api/alerts').flush([ALERTS[2]!]);
  });

  it('asks for the alerts at once, every 30 seconds after, and on each navigation', async () => {
    jest.useFakeTimers({ doNotFake: ['queueMicrotask', 'nextTick', 'setImmediate'] });
    create();
    fixture.detectChanges();
    jest.advanceTimersByTime(0);
    server.expectOne('api/alerts').flush([]);

    jest.advanceTimersByTime(ALERTS_POLL_MS - 1);
    server.expectNone('api/alerts');
    jest.advanceTimersByTime(1);
    server.expectOne('api/alerts').flush([ALERTS[0]!]);
    fixture.detectChanges();
    expect(element('alerts-count')?.textContent?.trim()).toBe('1');

    await TestBed.inject(Router).navigateByUrl('/structures/41');
    jest.advanceTimersByTime(0);
    server.expectOne('api/alerts').flush(ALERTS);
    fixture.detectChanges();
    expect(element('alerts-count')?.textContent?.trim()).toBe('2');

    // The navigation started the 30 s count again.
    jest.advanceTimersByTime(ALERTS_POLL_MS - 1);
    server.expectNone('api/alerts');
    jest.advanceTimersByTime(1);
    server.expectOne('api/alerts').flush(ALERTS);
  });

  it('stops asking once it is gone, as when its user signs out', () => {
    jest.useFakeTimers({ doNotFake: ['queueMicrotask', 'nextTick', 'setImmediate'] });
    create();
    fixture.detectChanges();
    jest.advanceTimersByTime(0);
    server.expectOne('api/alerts').flush([]);

    fixture.destroy();
    jest.advanceTimersByTime(3 * ALERTS_POLL_MS);
    server.expectNone('api/alerts');
  });

  it('keeps the alerts it has when the server cannot be reached, and asks again later', () => {
    jest.useFakeTimers({ doNotFake: ['queueMicrotask', 'nextTick', 'setImmediate'] });
    create();
    fixture.detectChanges();
    jest.advanceTimersByTime(0);
    server.expectOne('api/alerts').flush([ALERTS[0]!]);
    jest.advanceTimersByTime(ALERTS_POLL_MS);
    server.expectOne('api/alerts').error(new ProgressEvent('error'), { status: 0 });
    fixture.detectChanges();
    expect(element('alerts-count')?.textContent?.trim()).toBe('1');

    jest.advanceTimersByTime(ALERTS_POLL_MS);
    server.expectOne('api/alerts').flush([]);
  });
});
