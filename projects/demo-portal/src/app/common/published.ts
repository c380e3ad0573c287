import {
  findPublishedScenario,
  type PublishedScenario,
} from '../../../../elements/src/published-scenarios';

/**
 * The published scenario a portal page binds to, by its public id. The catalogue is shared
 * with the custom elements, so a page and an element naming the same id show the same thing.
 */
export function publishedScenario(id: string): PublishedScenario {
  const scenario = findPublishedScenario(id);
  if (!scenario) throw new Error(`no published scenario "${id}"`);
  return scenario;
}

export {
  comparisonRequest,
  sweepRequest,
  type PublishedScenario,
} from '../../../../elements/src/published-scenarios';
