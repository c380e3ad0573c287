import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { provideTroplineTesting, TrajectoryChartHarness } from '@tropline/widgets/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HomePage } from './home-page';

describe('HomePage', () => {
  it('projects the mere’s chain and describes it for screen readers', async () => {
    TestBed.configureTestingModule({
      imports: [HomePage],
      providers: [provideTroplineTesting(), provideRouter([])],
    });
    const fixture = TestBed.createComponent(HomePage);
    for (let i = 0; i < 4; i++) {
      await new Promise((r) => setTimeout(r, 0));
      await fixture.whenStable();
    }
    const chart =
      await TestbedHarnessEnvironment.loader(fixture).getHarness(TrajectoryChartHarness);
    expect(await chart.getSummary()).toContain('Water flea (Daphnia pulex) ranges from');
  });
});
