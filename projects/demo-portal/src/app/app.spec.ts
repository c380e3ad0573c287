import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { App } from './app';

describe('Larchmere portal frame', () => {
  it('names the authority, says it is invented, and offers a skip link', async () => {
    TestBed.configureTestingModule({ imports: [App], providers: [provideRouter([])] });
    const fixture = TestBed.createComponent(App);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('.lla-brand__name')?.textContent).toContain(
      'Larchmere Lakes & Uplands Authority',
    );
    expect(el.querySelector('footer')?.textContent).toContain('invented agency');
    expect(el.querySelector('a.lla-skip')?.getAttribute('href')).toBe('#main');
  });
});
