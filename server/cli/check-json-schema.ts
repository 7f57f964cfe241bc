/**
 * The JSON Schema (draft-07) of the document `runnel check --format json` writes: the contract CI scripts can
 * rely on, checked against the real output by test/cli. Fields may be added within a schema version; removing or
 * changing one raises CHECK_JSON_SCHEMA_VERSION. Every number is SI and its unit is in the field name
 * (`normalDepth_m`, `discharge_m3s`, `velocity_mps`, `maxShear_Pa`); slopes are m/m; Froude numbers and side
 * slopes (`_HV`, horizontal per vertical) have no unit. Values that do not exist are null, never NaN.
 */
import { CHECK_JSON_SCHEMA_VERSION } from './check-output.js';

const number = { type: 'number' } as const;
const nullableNumber = { type: ['number', 'null'] } as const;
const string = { type: 'string' } as const;
const nullableString = { type: ['string', 'null'] } as const;
const severity = { enum: ['error', 'warning', 'information'] } as const;
const status = { enum: ['pass', 'information', 'warning', 'fail'] } as const;

const position = { type: 'object', required: ['line', 'character'], properties: { line: number, character: number } } as const;
const location = {
  type: 'object',
  required: ['uri', 'range'],
  properties: { uri: string, range: { type: 'object', required: ['start', 'end'], properties: { start: position, end: position } } },
} as const;

const state = {
  type: 'object',
  required: ['depth_m', 'area_m2', 'wettedPerimeter_m', 'topWidth_m', 'hydraulicRadius_m', 'hydraulicDepth_m', 'velocity_mps', 'froudeNumber', 'specificEnergy_m', 'specificForce_m3'],
  properties: {
    depth_m: number,
    area_m2: number,
    wettedPerimeter_m: number,
    topWidth_m: number,
    hydraulicRadius_m: number,
    hydraulicDepth_m: number,
    velocity_mps: number,
    froudeNumber: number,
    specificEnergy_m: number,
    specificForce_m3: number,
  },
} as const;

const finding = {
  type: 'object',
  required: ['code', 'severity', 'message', 'location', 'channel', 'reach', 'flow', 'data'],
  properties: {
    code: { type: 'string', pattern: '^[a-z0-9]+(-[a-z0-9]+)*$' },
    severity,
    message: string,
    location,
    channel: nullableString,
    reach: nullableString,
    flow: nullableString,
    data: { type: 'object', additionalProperties: { type: ['number', 'string'] } },
  },
} as const;

/** A reach's share of its channel's water-surface profile at one flow (stations in m from the channel's head). */
const stationRange = { type: 'object', required: ['fromStation_m', 'toStation_m'], properties: { fromStation_m: number, toStation_m: number } } as const;
const reachFlowProfile = {
  type: 'object',
  required: ['startStation_m', 'endStation_m', 'maximumDepth_m', 'maximumDepthStation_m', 'minimumFreeboard_m', 'minimumFreeboardStation_m', 'overtoppedRanges', 'profileClasses'],
  properties: {
    startStation_m: number,
    endStation_m: number,
    maximumDepth_m: number,
    maximumDepthStation_m: number,
    minimumFreeboard_m: nullableNumber,
    minimumFreeboardStation_m: nullableNumber,
    overtoppedRanges: { type: 'array', items: stationRange },
    profileClasses: { type: 'array', items: string },
  },
} as const;

/** The water-surface profile of a channel at one flow: points, profile classes, jumps and remarks. */
const channelFlowProfile = {
  type: 'object',
  required: ['flow', 'computed', 'failure', 'datum', 'points', 'segments', 'jumps', 'notes'],
  properties: {
    flow: string,
    computed: { type: 'boolean' },
    failure: {
      oneOf: [
        { type: 'object', required: ['reason', 'message', 'reach', 'station_m'], properties: { reason: string, message: string, reach: nullableString, station_m: nullableNumber } },
        { type: 'null' },
      ],
    },
    datum: { enum: ['absolute', 'relative-to-outlet'] },
    points: {
      type: 'array',
      items: {
        type: 'object',
        required: ['station_m', 'reach', 'depth_m', 'invert_m', 'waterSurface_m', 'velocity_mps', 'froudeNumber'],
        properties: { station_m: number, reach: string, depth_m: number, invert_m: number, waterSurface_m: number, velocity_mps: number, froudeNumber: number },
      },
    },
    segments: {
      type: 'array',
      items: {
        type: 'object',
        required: ['reach', 'fromStation_m', 'toStation_m', 'profileClass'],
        properties: { reach: string, fromStation_m: number, toStation_m: number, profileClass: { enum: ['M1', 'M2', 'M3', 'S1', 'S2', 'S3', 'C1', 'C3', 'H2', 'H3', 'A2', 'A3', 'uniform'] }, description: string },
      },
    },
    jumps: {
      type: 'array',
      items: {
        type: 'object',
        required: ['station_m', 'reach', 'placement', 'upstreamDepth_m', 'downstreamDepth_m', 'upstreamFroudeNumber', 'energyLoss_m', 'jumpType', 'sweptOut'],
        properties: {
          station_m: number,
          reach: string,
          placement: { enum: ['within-reach', 'at-junction', 'beyond-outlet'] },
          upstreamDepth_m: number,
          downstreamDepth_m: number,
          upstreamFroudeNumber: number,
          upstreamVelocity_mps: number,
          energyLoss_m: number,
          jumpType: { enum: ['undular', 'weak', 'oscillating', 'steady', 'strong', 'not-a-jump'] },
          supercriticalFrom: string,
          sweptOut: { type: 'boolean' },
          nearCritical: { type: 'boolean' },
          description: string,
        },
      },
    },
    notes: {
      type: 'array',
      items: { type: 'object', required: ['code', 'message', 'reach', 'station_m'], properties: { code: string, message: string, reach: nullableString, station_m: nullableNumber } },
    },
    maximumEnergyResidual_m: nullableNumber,
  },
} as const;

const flowResult = {
  type: 'object',
  required: ['flow', 'discharge_m3s', 'normal', 'critical', 'regime', 'maxShear_Pa', 'averageShear_Pa', 'freeboard_m', 'requiredFreeboard_m', 'status', 'findings'],
  properties: {
    flow: string,
    description: nullableString,
    discharge_m3s: number,
    normal: { oneOf: [state, { type: 'null' }] },
    critical: { oneOf: [state, { type: 'null' }] },
    normalDepthNote: nullableString,
    criticalSlope: nullableNumber,
    regime: { enum: ['subcritical', 'critical', 'supercritical', null] },
    slopeClass: { enum: ['mild', 'critical', 'steep', 'horizontal', 'adverse'] },
    maxShear_Pa: nullableNumber,
    averageShear_Pa: nullableNumber,
    freeboard_m: nullableNumber,
    requiredFreeboard_m: nullableNumber,
    status,
    findings: { type: 'array', items: finding },
    profile: { oneOf: [reachFlowProfile, { type: 'null' }] },
  },
} as const;

const reach = {
  type: 'object',
  required: ['channel', 'name', 'location', 'section', 'lining', 'slope', 'length_m', 'bankfullCapacity_m3s', 'criteria', 'flows', 'status', 'provenance'],
  properties: {
    channel: string,
    name: string,
    location,
    section: {
      type: 'object',
      required: ['name', 'shape', 'dimensions', 'bankDepth_m', 'fullDepth_m'],
      properties: {
        name: string,
        shape: { enum: ['rectangle', 'trapezoid', 'triangle', 'parabola', 'circle'] },
        // Unit-suffixed keys: bottomWidth_m, leftSideSlope_HV, diameter_m, ...
        dimensions: { type: 'object', propertyNames: { pattern: '_(m|HV)$' }, additionalProperties: number },
        bankDepth_m: nullableNumber,
        fullDepth_m: nullableNumber,
      },
    },
    lining: {
      type: 'object',
      required: ['name', 'manningN', 'maxVelocity_mps', 'maxShear_Pa'],
      properties: { name: string, manningN: number, maxVelocity_mps: nullableNumber, maxShear_Pa: nullableNumber, description: nullableString },
    },
    slope: number,
    length_m: number,
    upstreamInvert_m: nullableNumber,
    downstreamInvert_m: nullableNumber,
    bankfullCapacity_m3s: nullableNumber,
    criteria: {
      type: 'object',
      required: ['freeboard', 'avoidFroude', 'minVelocity_mps'],
      properties: {
        avoidFroude: { type: 'object', required: ['low', 'high'], properties: { low: number, high: number } },
        minVelocity_mps: nullableNumber,
        limitMargin: number,
        // Where each criterion came from: built-in default, a setting or command-line option, the design, the reach.
        origin: { type: 'object', additionalProperties: { enum: ['default', 'setting', 'design', 'reach'] } },
      },
    },
    flows: { type: 'array', items: flowResult },
    status,
    provenance: {
      type: 'object',
      required: ['method', 'assumptions', 'references'],
      properties: { method: string, assumptions: { type: 'array', items: string }, references: { type: 'array', items: string } },
    },
  },
} as const;

const analysis = {
  type: 'object',
  required: ['uri', 'title', 'displayUnits', 'channels', 'findings', 'caution', 'assumptions', 'provenance'],
  properties: {
    uri: string,
    title: string,
    notes: { type: 'array', items: string },
    displayUnits: { enum: ['SI', 'US'] },
    channels: {
      type: 'array',
      items: {
        type: 'object',
        required: ['name', 'reaches'],
        properties: { name: string, reaches: { type: 'array', items: reach }, profiles: { type: 'array', items: channelFlowProfile } },
      },
    },
    findings: { type: 'array', items: finding },
    caution: { type: 'string', minLength: 1 },
    assumptions: { type: 'array', items: string },
  },
} as const;

const tally = {
  type: 'object',
  required: ['errors', 'warnings', 'information'],
  properties: { errors: { type: 'integer', minimum: 0 }, warnings: { type: 'integer', minimum: 0 }, information: { type: 'integer', minimum: 0 } },
} as const;

const diagnostic = {
  type: 'object',
  additionalProperties: false,
  required: ['severity', 'code', 'message', 'source', 'line', 'column', 'endLine', 'endColumn'],
  properties: {
    severity,
    code: string,
    message: string,
    source: { enum: ['syntax', 'reference', 'validation', 'analysis'] },
    line: { type: 'integer', minimum: 1 },
    column: { type: 'integer', minimum: 1 },
    endLine: { type: 'integer', minimum: 1 },
    endColumn: { type: 'integer', minimum: 1 },
  },
} as const;

export const CHECK_JSON_SCHEMA = {
  $schema: 'http://json-schema.org/draft-07/schema#',
  title: 'runnel check --format json',
  type: 'object',
  required: ['schemaVersion', 'tool', 'caution', 'summary', 'files'],
  properties: {
    schemaVersion: { const: CHECK_JSON_SCHEMA_VERSION },
    tool: { type: 'object', required: ['name', 'version'], properties: { name: { const: 'runnel' }, version: string } },
    caution: { type: 'string', minLength: 1 },
    summary: { allOf: [tally, { type: 'object', required: ['files'], properties: { files: { type: 'integer', minimum: 0 } } }] },
    files: {
      type: 'array',
      items: {
        type: 'object',
        required: ['path', 'uri', 'summary', 'diagnostics', 'analysis'],
        properties: {
          path: string,
          uri: string,
          summary: tally,
          diagnostics: { type: 'array', items: diagnostic },
          analysis: { oneOf: [analysis, { type: 'null' }] },
        },
      },
    },
  },
} as const;
