import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { findEquilibria, HASTINGS_POWELL_BENCHMARK, ROSENZWEIG_MACARTHUR } from '@tropline/core';
import type { ChainModel } from '@tropline/core/contract';
import {
  engineTrajectory,
  PhasePortraitHarness,
  provideTroplineTesting,
} from '@tropline/widgets/testing';
import { PhasePortrait } from './phase-portrait';
import { VIEW_STEP } from './phase-portrait-3d-options';

const trajectory = (model: ChainModel, initial: Record<string, number>) =>
  engineTrajectory(model, initial, 100, 101);

const chain = HASTINGS_POWELL_BENCHMARK;

@Component({
  imports: [PhasePortrait],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-phase-portrait [model]="model" [data]="data" [equilibria]="equilibria" />`,
})
class Host {
  model: ChainModel = chain.model;
  data = trajectory(chain.model, { ...chain.initial });
  equilibria = findEquilibria(chain.model);
}

async function setup(preset = chain) {
  TestBed.configureTestingModule({ imports: [Host], providers: [provideTroplineTesting()] });
  const fixture = TestBed.createComponent(Host);
  fixture.componentInstance.model = preset.model;
  fixture.componentInstance.data = trajectory(preset.model, { ...preset.initial });
  fixture.componentInstance.equilibria = findEquilibria(preset.model);
  const harness = await TestbedHarnessEnvironment.loader(fixture).getHarness(PhasePortraitHarness);
  return { fixture, harness, el: fixture.nativeElement as HTMLElement };
}

describe('PhasePortrait', () => {
  it('opens in the plane and offers the box for a chain of three levels', async () => {
    const { harness, el } = await setup();
    expect(await harness.getSummary()).toMatch(/^Phase portrait of /);
    expect(await harness.getViewAngles()).toBeNull();
    await harness.showView('box');
    expect(await harness.getSummary()).toMatch(
      /^Three-level view of .+ turned -55° and tilted 25°/,
    );
    expect(await harness.getViewAngles()).toEqual({ azimuth: -55, elevation: 25 });
    // The focused chart tells a screen reader how to turn it.
    const canvas = el.querySelector('.tropline-phase-portrait__canvas')!;
    const hint = canvas.getAttribute('aria-describedby')!.split(' ')[1]!;
    expect(el.querySelector(`#${hint}`)!.textContent).toContain('left and right arrows turn');
  });

  it('turns and tilts the box with the arrow keys, sliders and summary following', async () => {
    const { harness } = await setup();
    await harness.showView('box');
    await harness.pressOnChart('ArrowRight');
    await harness.pressOnChart('ArrowRight');
    await harness.pressOnChart('ArrowDown');
    expect(await harness.getViewAngles()).toEqual({
      azimuth: -55 + 2 * VIEW_STEP,
      elevation: 25 - VIEW_STEP,
    });
    expect(await harness.getSummary()).toContain(
      `turned ${-55 + 2 * VIEW_STEP}° and tilted ${25 - VIEW_STEP}°`,
    );
    await harness.pressOnChart('Home');
    expect(await harness.getViewAngles()).toEqual({ azimuth: -55, elevation: 25 });
  });

  it('picks the three levels of the box and tabulates them', async () => {
    const { harness } = await setup();
    await harness.showView('box');
    const [a, b, c] = chain.model.levels.map((l) => l.id) as [string, string, string];
    await harness.pickLevels(c, a, b);
    const names = chain.model.levels.map((l) => l.name);
    expect(await harness.getSummary()).toContain(
      `Three-level view of ${names[2]} (across), ${names[1]} (depth) and ${names[0]} (up)`,
    );
    await harness.toggleTable();
    expect(await harness.getTableRowCount()).toBe(101);
  });

  it('offers no box for a two-level chain', async () => {
    const { harness, el } = await setup(ROSENZWEIG_MACARTHUR);
    expect(el.querySelector('mat-button-toggle-group')).toBeNull();
    await expect(harness.showView('box')).rejects.toThrow(/fewer than three levels/);
  });
});
