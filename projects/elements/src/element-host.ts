import {
  computed,
  createEnvironmentInjector,
  Directive,
  effect,
  EnvironmentInjector,
  inject,
  input,
  output,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { provideTropline, TroplineClient } from '@tropline/widgets';
import { switchMap } from 'rxjs';
import {
  ELEMENT_REPORTER,
  ElementClient,
  refusalOf,
  type ElementRefusal,
  type ElementResult,
} from './element-client';
import {
  missingScenarioMessage,
  PUBLISHED_BINDING,
  PublishedScenarioApi,
  type PublishedScenario,
  type PublishedState,
} from './published-scenario';

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
        PublishedScenarioApi,
        { provide: PUBLISHED_BINDING, useValue: { published: () => this.published() } },
        { provide: TroplineClient, useClass: ElementClient },
      ],
      this.parent,
      'tropline-element',
    ),
  );

  /** The client of the current injector, for elements that call the API themselves. */
  protected readonly client = computed(() => this.environment().get(TroplineClient));

  /** The published scenario named by `scenario`, as the API serves it: loading, ready, refused. */
  protected readonly state = toSignal(
    toObservable(
      computed(() => ({ api: this.environment().get(PublishedScenarioApi), id: this.scenario() })),
    ).pipe(switchMap(({ api, id }) => api.load(id))),
    { initialValue: { kind: 'loading', publicId: '' } as PublishedState },
  );

  /** The published scenario once loaded, or undefined. */
  protected readonly published = computed(() => {
    const s = this.state();
    return s.kind === 'ready' ? s.scenario : undefined;
  });

  /** The heading and sentence shown when the scenario cannot be shown. */
  protected readonly refusal = computed(() => {
    const s = this.state();
    return s.kind === 'refused' ? s.error : undefined;
  });

  constructor() {
    // An injector replaced by new attributes is destroyed once the widget has moved on to the
    // new one (after this render), and the last one when the element leaves the page.
    effect((onCleanup) => {
      const env = this.environment();
      onCleanup(() => queueMicrotask(() => env.destroy()));
    });
    effect(() => {
      const s = this.state();
      if (s.kind === 'ready')
        this.ready.emit({ scenario: s.scenario.publicId, title: s.scenario.name });
      else if (s.kind === 'refused' && s.publicId) this.refused.emit(refusalOf(s.error));
    });
  }

  /** The sentence shown when `scenario` names nothing (before any request is made). */
  protected missingMessage(): string {
    return missingScenarioMessage(this.scenario());
  }
}

/** What a template receives for a scenario: the scenario or the reason there is none. */
export type Published = PublishedScenario | undefined;
