/**
 * Each design flow keeps one colour across every drawing and table of a report: flows are numbered in the order
 * they first appear in the design, and the number picks a CSS class (`flow-0` ... `flow-5`) whose colour the
 * stylesheet defines for light, dark and print.
 */
import type { DesignAnalysis } from '../analysis/model.js';

/** Number of distinct flow colours; further flows reuse them in turn. */
export const FLOW_COLOUR_COUNT = 6;

/** Flow names in order of first appearance over all channels and reaches. */
export function designFlowOrder(analysis: DesignAnalysis): readonly string[] {
  const order: string[] = [];
  const seen = new Set<string>();
  for (const channel of analysis.channels) {
    for (const reach of channel.reaches) {
      for (const flow of reach.flows) {
        if (!seen.has(flow.flow)) {
          seen.add(flow.flow);
          order.push(flow.flow);
        }
      }
    }
  }
  return order;
}

/** The CSS class of a flow's colour; a flow missing from `order` uses its position in its own list. */
export function flowColourClass(flowName: string, order: readonly string[] | undefined, positionInList: number): string {
  const index = order?.indexOf(flowName) ?? -1;
  return `flow-${(index >= 0 ? index : positionInList) % FLOW_COLOUR_COUNT}`;
}
