import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { StatusPage } from './status-page';

describe('StatusPage', () => {
  function setup() {
    TestBed.configureTestingModule({
      imports: [StatusPage],
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    const fixture = TestBed.createComponent(StatusPage);
    fixture.detectChanges();
    return { fixture, http: TestBed.inject(HttpTestingController) };
  }

  it('reports the API version and database latency when the service answers', async () => {
    const { fixture, http } = setup();
    http
      .expectOne('/api/v1/health')
      .flush({ status: 'ok', version: '0.1.0', database: { status: 'ok', latencyMs: 0.25 } });
    await fixture.whenStable();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('API 0.1.0 is answering');
    expect(text).toContain('0.25 ms');
  });

  it('raises an alert when the service does not answer', async () => {
    const { fixture, http } = setup();
    http.expectOne('/api/v1/health').error(new ProgressEvent('error'), { status: 0 });
    await fixture.whenStable();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('The API is not answering');
  });
});
