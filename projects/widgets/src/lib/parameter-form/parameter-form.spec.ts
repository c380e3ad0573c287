import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { type ChainModel, LAKE_DEMO } from '@tropline/core';
import { MatSliderHarness } from '@angular/material/slider/testing';
import { ParameterFormHarness, provideTroplineTesting } from '@tropline/widgets/testing';
import { ParameterForm } from './parameter-form';
import type { ParameterBounds } from './parameter-form-schema';

@Component({
  imports: [ParameterForm],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-parameter-form
    [model]="model"
    [bounds]="bounds()"
    (modelChange)="emitted.push($event)"
  />`,
})
class Host {
  readonly model = LAKE_DEMO.model;
  readonly bounds = signal<readonly ParameterBounds[] | undefined>([
    { pointer: '/levels/0/carryingCapacity', min: 20, max: 60 },
    { pointer: '/levels/2/mortality', min: 0.001, max: 0.02 },
  ]);
  readonly emitted: ChainModel[] = [];
}

describe('ParameterForm', () => {
  async function setup() {
    TestBed.configureTestingModule({ imports: [Host], providers: [provideTroplineTesting()] });
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const form = await loader.getHarness(ParameterFormHarness);
    return { fixture, form, loader };
  }

  it('groups by level and opens only what the publisher allowed', async () => {
    const { form } = await setup();
    expect(await form.getGroups()).toEqual([
      'Green algae (Scenedesmus spp.) — producer',
      'Water flea (Daphnia pulex) — grazer',
      'Juvenile yellow perch (Perca flavescens) — top predator',
    ]);
    expect(await form.getEditableCount()).toBe(2);
    // Lake: 2 producer + 4 + 4 consumer parameters, two of them opened by the publisher.
    expect(await form.getFixedCount()).toBe(8);
  });

  it('emits the whole model for a valid value and explains one out of range', async () => {
    const { fixture, form } = await setup();
    await form.setValue('Carrying capacity K', '55');
    expect(fixture.componentInstance.emitted.at(-1)!.levels[0]).toMatchObject({
      carryingCapacity: 55,
    });
    const count = fixture.componentInstance.emitted.length;
    await form.setValue('Carrying capacity K', '75');
    expect(await form.getErrors()).toEqual(['Must be at most 60 g C m⁻².']);
    expect(fixture.componentInstance.emitted.length).toBe(count);
  });

  it('keeps each slider and its numeric field at the same value, whichever moves', async () => {
    const { fixture, form, loader } = await setup();
    const thumb = await (await loader.getHarness(MatSliderHarness)).getEndThumb();
    const field = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>(
      'input[type="number"]',
    )!;
    await form.setValue('Carrying capacity K', '55');
    expect(await thumb.getValue()).toBe(55);
    await thumb.setValue(25);
    await fixture.whenStable();
    expect(field.value).toBe('25');
    expect(fixture.componentInstance.emitted.at(-1)!.levels[0]).toMatchObject({
      carryingCapacity: 25,
    });
  });

  it('resets to the published values', async () => {
    const { fixture, form } = await setup();
    await form.setValue('Carrying capacity K', '30');
    await form.reset();
    expect(fixture.componentInstance.emitted.at(-1)!.levels[0]).toMatchObject({
      carryingCapacity: 40,
    });
  });
});
