/** What the exposure panel and the map share: the rule drawn on the map and whether the feed route is being edited. */
import type { ExposureRule } from './exposure.ts';

export const exposureView = $state<{ rule: ExposureRule; editingRoute: boolean }>({
  rule: 'fcc',
  editingRoute: false,
});
