/** How a published scenario is put on a page, in the two forms the library offers. */
export interface EmbedSnippets {
  /** An Angular host app: provider once, then the panel fed by the published read. */
  readonly angular: string;
  /** Any HTML page: the elements module and one custom element. */
  readonly element: string;
}

/** The placeholder for the site's browser key, which the console never shows again. */
export const KEY_PLACEHOLDER = 'YOUR_BROWSER_KEY';

/**
 * The snippets for the scenario published as `publicId`, served from `origin`. The browser key
 * is left as a placeholder: keys are shown only once, when issued (API keys page).
 */
export function embedSnippets(origin: string, publicId: string): EmbedSnippets {
  const api = `${origin}/api/v1`;
  const angular = [
    '// app.config.ts',
    "import { provideTropline } from '@tropline/widgets';",
    `provideTropline({ apiUrl: '${api}', apiKey: '${KEY_PLACEHOLDER}' });`,
    '',
    `// The component: read the published scenario (GET ${api}/published-scenarios/${publicId}),`,
    '// then bind what it answers.',
    '<tropline-projection-panel',
    '  [model]="scenario.model"',
    '  [initial]="scenario.initial"',
    '  [horizon]="scenario.horizon"',
    '  [bounds]="scenario.publicParameters"',
    '/>',
  ].join('\n');
  const element = [
    `<link rel="stylesheet" href="${origin}/elements/tropline-elements.css" />`,
    `<script type="module" src="${origin}/elements/tropline-elements.js"></script>`,
    '',
    '<tropline-projection',
    `  api-url="${api}"`,
    `  api-key="${KEY_PLACEHOLDER}"`,
    `  scenario="${publicId}"`,
    '></tropline-projection>',
  ].join('\n');
  return { angular, element };
}
