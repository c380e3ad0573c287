import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { type ChainModel, LAKE_DEMO } from '@tropline/core';
import { MatSliderHarness } from '@angular/material/slider/testing';
import { ParameterFormHarness, provideTroplineTesting } from '@tropline/widgets/testing';
import { ParameterForm } from './parameter-form';
import type { ApiFieldError } from '../api/problem-message';
import type { ParameterBounds } from './parameter-form-schema';

@Component({
  imports: [ParameterForm],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-parameter-form
    [model]="model"
    [bounds]="bounds()"
    [fieldErrors]="fieldErrors()"
    (modelChange)="emitted.push($event)"
    (validChange)="validity.push($event)"
  />`,
})
class Host {
  readonly fieldErrors = signal<readonly ApiFieldError[]>([]);
  readonly validity: boolean[] = [];
  readonly model = LAKE_DEMO.model;
  readonly bounds = signal<readonly ParameterBounds[] | undefined>([
    { pointer: '/levels/0/carryingCapacity', min: 20, max: 60 },
    { pointer: '/levels/2/mortality', min: 0.001, max: 0.02 },
  ]);
  readonly emitted: ChainModel[] = [];
}

@Component({
  imports: [ParameterForm],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-parameter-form [model]="model" (modelChange)="emitted.push($event)" />`,
})
class OpenHost {
  readonly model = LAKE_DEMO.model;
  readonly emitted: ChainModel[] = [];
}

describe('ParameterForm with every parameter open (no bounds)', () => {
  // Regression: a growth rate of 0 lay inside the default 0–2× range, the model refused it
  // (the chain-model schema wants growthRate > 0), the throw ended the change stream and every
  // later edit was silently lost.
  it('refuses a value the model refuses, and keeps emitting later edits', async () => {
    TestBed.configureTestingModule({ imports: [OpenHost], providers: [provideTroplineTesting()] });
    const fixture = TestBed.createComponent(OpenHost);
    await fixture.whenStable();
    const form = await TestbedHarnessEnvironment.loader(fixture).getHarness(ParameterFormHarness);
    const emitted = fixture.componentInstance.emitted;

    await form.setValue('Growth rate r', '0');
    expect(emitted).toEqual([]);
    expect(await form.getErrors()).toEqual(['Must be greater than 0 per week.']);

    await form.setValue('Growth rate r', '1.5');
    await form.setValue('Carrying capacity K', '55');
    expect(emitted.at(-1)!.levels[0]).toMatchObject({ growthRate: 1.5, carryingCapacity: 55 });
  });
});

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

describe('ParameterForm for a host: ids, server errors, validity', () => {
  async function setup() {
    TestBed.configureTestingModule({ imports: [Host], providers: [provideTroplineTesting()] });
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    const form = await TestbedHarnessEnvironment.loader(fixture).getHarness(ParameterFormHarness);
    return { fixture, form, host: fixture.componentInstance };
  }

  it('gives each field a stable id from its pointer, and a second form its own', async () => {
    const { form } = await setup();
    expect(await form.getFieldIds()).toEqual([
      'tropline-param-levels-0-carryingCapacity',
      'tropline-param-levels-2-mortality',
    ]);
    const second = TestBed.createComponent(Host);
    await second.whenStable();
    const other = await TestbedHarnessEnvironment.loader(second).getHarness(ParameterFormHarness);
    expect(await other.getFieldId('Carrying capacity K')).toBe(
      'tropline-param-2-levels-0-carryingCapacity',
    );
  });

  it('shows a server error on the field its pointer names until that field is edited', async () => {
    const { fixture, form, host } = await setup();
    host.fieldErrors.set([
      { pointer: '/model/levels/0/carryingCapacity', message: 'outside the published range' },
      { pointer: '/horizon', message: 'must be at most 2000' },
    ]);
    await fixture.whenStable();
    expect(await form.getFieldError('Carrying capacity K')).toBe('Outside the published range');
    expect(await form.isFieldInvalid('Carrying capacity K')).toBe(true);
    expect(await form.getFieldError('Mortality m')).toBeNull();
    expect(await form.isFieldInvalid('Mortality m')).toBe(false);
    // The server's verdict is the host's to count: the values themselves are acceptable.
    expect(await form.isValid()).toBe(true);

    await form.setValue('Mortality m', '0.01');
    expect(await form.getFieldError('Carrying capacity K')).toBe('Outside the published range');
    await form.setValue('Carrying capacity K', '45');
    expect(await form.getFieldError('Carrying capacity K')).toBeNull();
    expect(await form.isFieldInvalid('Carrying capacity K')).toBe(false);
    expect(host.emitted.at(-1)!.levels[0]).toMatchObject({ carryingCapacity: 45 });
  });

  it('reports its validity as it changes and ties each message to its field', async () => {
    const { form, host } = await setup();
    expect(await form.isValid()).toBe(true);
    await form.setValue('Carrying capacity K', '75');
    expect(await form.isValid()).toBe(false);
    expect(await form.isFieldInvalid('Carrying capacity K')).toBe(true);
    expect(await form.getFieldError('Carrying capacity K')).toBe('Must be at most 60 g C m⁻².');
    await form.setValue('Carrying capacity K', '50');
    expect(await form.isValid()).toBe(true);
    expect(host.validity).toEqual([false, true]);
  });
});
