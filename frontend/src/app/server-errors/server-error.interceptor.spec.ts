import { HttpClient, HttpContext, HttpErrorResponse, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { firstValueFrom } from 'rxjs';

import { QUIET_ON_FAILURE, serverErrorInterceptor } from './server-error.interceptor';

describe('serverErrorInterceptor', () => {
  let http: HttpClient;
  let server: HttpTestingController;
  let snackBarOpen: jest.Mock;

  beforeEach(() => {
    snackBarOpen = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(withInterceptors([serverErrorInterceptor])),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: { open: snackBarOpen } },
      ],
    });
    http = TestBed.inject(HttpClient);
    server = TestBed.inject(HttpTestingController);
  });

  afterEach(() => server.verify());

  /** Starts a request, answers it with an error and returns what the caller was handed. */
  async function failingRequest(answer: (server: HttpTestingController) => void): Promise<unknown> {
    const result = firstValueFrom(http.get('api/structures')).catch((error: unknown) => error);
    answer(server);
    return result;
  }

  it("shows the server's message and request id", async () => {
    await failingRequest((s) =>
      s.expectOne('api/structures').flush(
        { error: { code: 'invalid_bbox', message: 'minLon must be less than maxLon', details: {} }, requestId: 'req-7f3a' },
        { status: 400, statusText: 'Bad Request' },
      ),
    );

    expect(snackBarOpen).toHaveBeenCalledTimes(1);
    expect(snackBarOpen).toHaveBeenCalledWith('minLon must be less than maxLon (request req-7f3a)', 'Dismiss', expect.anything());
  });

  it('still hands the error to the caller', async () => {
    const error = await failingRequest((s) =>
      s.expectOne('api/structures').flush({ error: { code: 'x', message: 'Nope' }, requestId: 'r1' }, { status: 403, statusText: 'Forbidden' }),
    );

    expect(error).toMatchObject({ status: 403 });
  });

  it('falls back to the status when the body is not the server error shape', async () => {
    await failingRequest((s) => s.expectOne('api/structures').flush('<html>gateway</html>', { status: 502, statusText: 'Bad Gateway' }));

    expect(snackBarOpen).toHaveBeenCalledWith('The request failed with status 502.', 'Dismiss', expect.anything());
  });

  it('says so when the server cannot be reached', async () => {
    await failingRequest((s) => s.expectOne('api/structures').error(new ProgressEvent('error'), { status: 0 }));

    expect(snackBarOpen).toHaveBeenCalledWith(expect.stringContaining('could not be reached'), 'Dismiss', expect.anything());
  });

  it('stays quiet when the request succeeds', async () => {
    const result = firstValueFrom(http.get('api/structures'));
    server.expectOne('api/structures').flush({ type: 'FeatureCollection', features: [] });
    await result;

    expect(snackBarOpen).not.toHaveBeenCalled();
  });

  it('stays quiet for a background request marked so, and still hands the caller the error', async () => {
    const result = firstValueFrom(http.get('api/alerts', { context: new HttpContext().set(QUIET_ON_FAILURE, true) })).catch((error: unknown) => error);
    server.expectOne('api/alerts').flush(null, { status: 503, statusText: 'Service Unavailable' });
    expect(await result).toBeInstanceOf(HttpErrorResponse);
    expect(snackBarOpen).not.toHaveBeenCalled();
  });
});
