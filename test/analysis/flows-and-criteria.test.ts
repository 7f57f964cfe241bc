/** Which discharge and which criteria apply in each reach; the USBR freeboard rule. */
import { describe, expect, it } from 'vitest';
import { USBR_FREEBOARD_RULE, usbrFreeboardCoefficientM, usbrFreeboardM } from '../../language/analysis/criteria-defaults.js';
import { CFS_M3S, FOOT_M, analyse, expectClose, flowOf, reachOf } from './analysis-test-kit.js';

const PARTS = `
section ditch trapezoid { bottom width 2 ft  side slopes 3:1  bank height 3 ft }
lining grass { n 0.035 }`;
const REACH = (name: string, extra = ''): string => `reach ${name} { section ditch  lining grass  slope 1 %  length 100 ft ${extra} }`;

describe('flows along a channel', () => {
  it("applies the flow table to every reach, a channel's own values to that channel, and a reach's values from there downstream", async () => {
    const analysis = await analyse(`
design "Flows"
units US
flows { q10 = 10 cfs "10-year"  q100 = 20 cfs "100-year" }
${PARTS}
channel upper { ${REACH('a')} ${REACH('b', 'flows { q10 = 15 cfs }')} ${REACH('c')} outlet free fall }
channel side { flows { q100 = 5 cfs } ${REACH('d')} outlet free fall }`);
    const discharge = (channel: string, reach: string, flow: string): number => flowOf(reachOf(analysis, channel, reach), flow).discharge_m3s / CFS_M3S;
    expectClose(discharge('upper', 'a', 'q10'), 10, 1e-9, 'a q10');
    expectClose(discharge('upper', 'b', 'q10'), 15, 1e-9, 'b q10 (its own)');
    expectClose(discharge('upper', 'c', 'q10'), 15, 1e-9, 'c q10 (carried down from b)');
    expectClose(discharge('upper', 'c', 'q100'), 20, 1e-9, 'c q100 (flow table)');
    expectClose(discharge('side', 'd', 'q100'), 5, 1e-9, "d q100 (channel's own)");
    expectClose(discharge('side', 'd', 'q10'), 10, 1e-9, 'd q10 (flow table)');
    expect(flowOf(reachOf(analysis, 'upper', 'a'), 'q10').description).toBe('10-year');
    expect(analysis.flows.map((flow) => [flow.name, flow.description])).toEqual([
      ['q10', '10-year'],
      ['q100', '100-year'],
    ]);
  });

  it('leaves out a flow with no discharge in a reach (validation reports it) and keeps the others', async () => {
    const analysis = await analyse(`design "F"\nunits US\nflows { q10 = 10 cfs  q100 }\n${PARTS}\nchannel c { ${REACH('a')} outlet free fall }`);
    expect(reachOf(analysis, 'c', 'a').flows.map((flow) => flow.flow)).toEqual(['q10']);
  });
});

describe('criteria in force', () => {
  it('takes reach values over design values over defaults, and says where each came from', async () => {
    const analysis = await analyse(`
design "C"
units US
criteria { freeboard 0.5 ft  minimum velocity 1.5 ft/s }
flows { q = 10 cfs }
${PARTS}
channel c { ${REACH('a')} ${REACH('b', 'criteria { freeboard 1 ft  avoid froude 0.8 to 1.2 }')} outlet free fall }`);
    const a = reachOf(analysis, 'c', 'a').criteria;
    const b = reachOf(analysis, 'c', 'b').criteria;
    expect(a.freeboard).toEqual({ kind: 'fixed', height_m: 0.5 * FOOT_M });
    expect(b.freeboard).toEqual({ kind: 'fixed', height_m: 1 * FOOT_M });
    expect(a.avoidFroude).toEqual({ low: 0.89, high: 1.13 });
    expect(b.avoidFroude).toEqual({ low: 0.8, high: 1.2 });
    expect(a.minVelocity_mps).toBeCloseTo(1.5 * FOOT_M, 12);
    expect(a.origin).toEqual({ freeboard: 'design', avoidFroude: 'default', minVelocity: 'design', limitMargin: 'default' });
    expect(b.origin).toEqual({ freeboard: 'reach', avoidFroude: 'reach', minVelocity: 'design', limitMargin: 'default' });
    expect(analysis.criteria.freeboard).toEqual({ kind: 'fixed', height_m: 0.5 * FOOT_M });
  });

  it('lets a reach turn freeboard off', async () => {
    const analysis = await analyse(`design "C"\nunits US\ncriteria { freeboard 0.5 ft }\nflows { q = 10 cfs }\n${PARTS}\nchannel c { ${REACH('a', 'criteria { freeboard none }')} outlet free fall }`);
    expect(reachOf(analysis, 'c', 'a').criteria.freeboard).toBeNull();
    expect(flowOf(reachOf(analysis, 'c', 'a'), 'q').requiredFreeboard_m).toBeNull();
  });

  it('defaults the near-critical band to FHWA HEC-11 (1989) Sec. 3.2, 0.89-1.13 (secondary)', async () => {
    const analysis = await analyse(`design "C"\nunits US\nflows { q = 10 cfs }\n${PARTS}\nchannel c { ${REACH('a')} outlet free fall }`);
    expect(analysis.criteria.avoidFroude).toEqual({ low: 0.89, high: 1.13 });
    expect(analysis.criteria.freeboard).toBeNull();
    expect(analysis.criteria.minVelocity_mps).toBeCloseTo(2 * FOOT_M, 12);
  });
});

describe('USBR freeboard rule F = sqrt(C y) (Chow 1959, Ch. 7; confirmed)', () => {
  it('takes C = 1.5 ft at 20 cfs and below, and 2.5 ft at 3,000 cfs and above (published end values)', () => {
    expectClose(usbrFreeboardCoefficientM(20 * CFS_M3S) / FOOT_M, 1.5, 1e-12, 'C at 20 cfs, ft');
    expectClose(usbrFreeboardCoefficientM(5 * CFS_M3S) / FOOT_M, 1.5, 1e-12, 'C at 5 cfs, ft');
    expectClose(usbrFreeboardCoefficientM(3000 * CFS_M3S) / FOOT_M, 2.5, 1e-12, 'C at 3,000 cfs, ft');
    expectClose(usbrFreeboardCoefficientM(10_000 * CFS_M3S) / FOOT_M, 2.5, 1e-12, 'C at 10,000 cfs, ft');
  });
  it('matches the SI end values 0.46 and 0.76 (confirmed) to their printed precision', () => {
    expectClose(USBR_FREEBOARD_RULE.lowCoefficient_m, 0.46, 0.005, 'C low, m');
    expectClose(USBR_FREEBOARD_RULE.highCoefficient_m, 0.76, 0.005, 'C high, m');
  });
  it("interpolates in log discharge between (Runnel's stated rule): C = 2.0 ft at sqrt(20 x 3,000) cfs", () => {
    expectClose(usbrFreeboardCoefficientM(Math.sqrt(20 * 3000) * CFS_M3S) / FOOT_M, 2.0, 1e-9, 'C at the geometric mean, ft');
  });
  it('gives F = sqrt(C y) in consistent units: C = 1.5 ft, y = 4 ft -> F = sqrt(6) ft (derived)', () => {
    expectClose(usbrFreeboardM(1.5 * FOOT_M, 4 * FOOT_M) / FOOT_M, Math.sqrt(6), 1e-12, 'F, ft');
  });
  it('is applied by the analysis at the flow, with y the normal depth', async () => {
    const analysis = await analyse(`design "U"\nunits US\ncriteria { freeboard usbr }\nflows { q = 20 cfs }\n${PARTS}\nchannel c { ${REACH('a')} outlet free fall }`);
    const flow = flowOf(reachOf(analysis, 'c', 'a'), 'q');
    const depthFt = (flow.normal?.depth_m ?? Number.NaN) / FOOT_M;
    expectClose((flow.requiredFreeboard_m ?? Number.NaN) / FOOT_M, Math.sqrt(1.5 * depthFt), 1e-9, 'required freeboard, ft');
  });
});
