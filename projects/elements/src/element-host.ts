import {
  computed,
  createEnvironmentInjector,
  Directive,
  effect,
  EnvironmentInjector,
  input,
  output,
} from '@angular/core';
import { inject } from '@angular/core';
import { provideTropline, TroplineClient } from '@tropline/widgets';
import {
  ELEMENT_REPORTER,
  ElementClient,
  type ElementRefusal,
  type ElementResult,
} from './element-client';
import { findPublishedScenario, type PublishedScenario } from './published-scenarios';

/** Detail of `tropline-ready`: which published scenario the element shows. */
export interface ElementReady {
  readonly scenario: string;
  readonly title: string;
}

/**
 * What every Tropline custom element shares: the attributes `api-url`, `api-key`, `scenario`
 * and `locale`, the DOM events `tropline-ready`, `tropline-result` and `tropline-refused`, and
 * an injector of its own built from its attributes, so two elements on one page may use
 * different APIs or keys. The widget inside is rendered with that injector.
 */
@Directive()
export abstract class ElementHost {
  private readonly parent = inject(EnvironmentInjector);

  /** Base URL of the Tropline API (attribute `api-url`). */
  readonly apiUrl = input<string>('/api/v1');
  /** The site's browser key (attribute `api-key`). Public by design; bound to the site's origin. */
  readonly apiKey = input<string>('');
  /** Public id of the published scenario to show (attribute `scenario`). */
  readonly scenario = input<string>('');
  /** BCP 47 locale for numbers and dates (attribute `locale`); default: the page's `lang`. */
  readonly locale = input<string | undefined>(undefined);

  // Outputs become the custom element's DOM events; plain pages expect kebab-case event names,
  // which only an alias can give (the rule is about Angular templates, not DOM events).
  /* eslint-disable @angular-eslint/no-output-rename */
  /** Fired once the scenario is known, with its id and title. */
  readonly ready = output<ElementReady>({ alias: 'tropline-ready' });
  /** Fired with every answer the API gives the widget. */
  readonly result = output<ElementResult>({ alias: 'tropline-result' });
  /** Fired when the API refuses a request (key, origin, quota, bounds) or cannot be reached. */
  readonly refused = output<ElementRefusal>({ alias: 'tropline-refused' });
  /* eslint-enable @angular-eslint/no-output-rename */

  /** The published scenario named by `scenario`, or undefined. */
  protected readonly published = computed(() => findPublishedScenario(this.scenario()));

  /** An injector with the widgets' providers for this element's API and key. */
  protected readonly environment = computed(() =>
    createEnvironmentInjector(
      [
        provideTropline({
          apiUrl: this.apiUrl() || '/api/v1',
          apiKey: this.apiKey(),
          ...(this.locale() ? { locale: this.locale() } : {}),
        }),
        {
          provide: ELEMENT_REPORTER,
          useValue: {
            result: (r: ElementResult) => this.result.emit(r),
            refused: (r: ElementRefusal) => this.refused.emit(r),
          },
        },
        { provide: TroplineClient, useClass: ElementClient },
      ],
      this.parent,
      'tropline-element',
    ),
  );

  /** The client of the current injector, for elements that call the API themselves. */
  protected readonly client = computed(() => this.environment().get(TroplineClient));

  constructor() {
    // An injector replaced by new attributes is destroyed once the widget has moved on to the
    // new one (after this render), and the last one when the element leaves the page.
    effect((onCleanup) => {
      const env = this.environment();
      onCleanup(() => queueMicrotask(() => env.destroy()));
    });
    effect(() => {
      const s = this.published();
      if (s) this.ready.emit({ scenario: s.id, title: s.title });
      else if (this.scenario()) {
        this.refused.emit({
          status: 404,
          title: 'No such published scenario',
          message: this.missingMessage(),
          fieldErrors: [],
        });
      }
    });
  }

  /** The sentence shown when `scenario` names nothing published. */
  protected missingMessage(): string {
    const id = this.scenario();
    return id
      ? `No published scenario is called “${id}”. Check the scenario attribute.`
      : 'This element needs a scenario attribute naming a published scenario.';
  }
}

/** What a template receives for a scenario: the scenario or the reason there is none. */
export type Published = PublishedScenario | undefined;
