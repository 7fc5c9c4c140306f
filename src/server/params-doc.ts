/**
 * GET /v1/params: every request parameter as a flat list a form can be built from (dotted name,
 * number or integer, unit, allowed range, default, meaning), plus the seed's rules, the formats
 * and the export options. Made from the zod schemas (src/schema/params.ts and
 * ./export-query.ts), which take their numbers from the core's LIMITS and DEFAULTS: nothing here
 * repeats a number.
 */
import { z } from 'zod';
import { SEED_MAX, SEED_STRING_MAX_CHARS } from '../core/index.js';
import { EXPORT_FORMAT_NAMES, EXPORT_FORMATS } from '../export/index.js';
import { trackRequestSchema } from '../schema/params.js';
import { exportQueryShape, OPTION_FORMATS } from './export-query.js';

/**
 * Units a parameter may carry, read from its name's suffix (`lengthM`, `curvatureBudgetDeg`,
 * `topSpeedMps`), longest suffix first.
 */
export const PARAM_UNITS = { Mps2: 'm/s²', Mps: 'm/s', Deg: 'deg', M: 'm' } as const;
export type ParamUnit = (typeof PARAM_UNITS)[keyof typeof PARAM_UNITS];

/** How a parameter is written: a number, a whole number, one of a few words, or other text. */
export type ParamType = 'number' | 'integer' | 'choice' | 'text';

/** One request parameter. */
export interface ParamDoc {
  /** Dotted name, as the query string of GET /v1/tracks/{seed} writes it (`widthM.min`). */
  readonly name: string;
  readonly type: ParamType;
  /** 'm', 'deg', 'm/s', 'm/s²', or null for plain numbers (shares, counts) and words. */
  readonly unit: ParamUnit | null;
  /** Smallest and largest allowed value (number and integer parameters). */
  readonly min?: number;
  readonly max?: number;
  /** The allowed words (choice parameters). */
  readonly values?: readonly string[];
  /** The value used when the parameter is left out; null when it is derived from others. */
  readonly default: number | string | null;
  /** The default in words (`1500`, `derived from lengthM and curvatureBudgetDeg`). */
  readonly defaultText: string;
  /** What it does, one sentence. */
  readonly meaning: string;
}

/** One option of an export. */
export interface ExportOptionDoc {
  readonly name: string;
  readonly format: string;
  readonly type: 'boolean' | 'integer' | 'string';
  readonly values?: readonly string[];
  readonly min?: number;
  readonly max?: number;
  readonly description: string;
}

/** The whole answer of GET /v1/params. */
export interface ParamsDoc {
  readonly seed: { readonly integerMax: number; readonly stringMaxChars: number; readonly description: string };
  readonly parameters: readonly ParamDoc[];
  readonly formats: readonly { readonly name: string; readonly mediaType: string; readonly extension: string; readonly binary: boolean }[];
  readonly exportOptions: readonly ExportOptionDoc[];
}

interface JsonSchemaNode {
  readonly type?: string;
  readonly description?: string;
  readonly minimum?: number;
  readonly maximum?: number;
  readonly default?: unknown;
  readonly enum?: readonly string[];
  readonly properties?: Readonly<Record<string, JsonSchemaNode>>;
  readonly $ref?: string;
  readonly $defs?: Readonly<Record<string, JsonSchemaNode>>;
}

/**
 * Describes every request parameter, in the schema's order, nested ones flattened.
 * @param schema the request schema (tests pass others)
 * @example describeParams().parameters.find((p) => p.name === 'lengthM')?.unit // 'm'
 */
export function describeParams(schema: z.ZodType = trackRequestSchema): ParamsDoc {
  const root = resolveRoot(z.toJSONSchema(schema, { io: 'input' }) as JsonSchemaNode);
  const parameters: ParamDoc[] = [];
  for (const [key, node] of Object.entries(root.properties ?? {})) {
    if (key === 'seed') continue;
    if (node.type === 'object') {
      for (const [sub, leaf] of Object.entries(node.properties ?? {})) {
        const inherited = isRecord(node.default) ? node.default[sub] : undefined;
        parameters.push(leafDoc(`${key}.${sub}`, unitOf(sub) ?? unitOf(key), leaf, inherited));
      }
    } else {
      parameters.push(leafDoc(key, unitOf(key), node, undefined));
    }
  }
  const options = z.toJSONSchema(z.object(exportQueryShape), { io: 'input' }) as JsonSchemaNode;
  const exportOptions: ExportOptionDoc[] = [];
  for (const [name, format] of Object.entries(OPTION_FORMATS)) {
    const node = options.properties?.[name] ?? {};
    const doc: ExportOptionDoc = { name, format, type: node.type === 'integer' ? 'integer' : node.type === 'boolean' ? 'boolean' : 'string', description: node.description ?? '' };
    exportOptions.push({ ...doc, ...(node.enum ? { values: node.enum } : {}), ...(node.minimum !== undefined ? { min: node.minimum } : {}), ...(node.maximum !== undefined ? { max: node.maximum } : {}) });
  }
  return {
    seed: { integerMax: SEED_MAX, stringMaxChars: SEED_STRING_MAX_CHARS, description: root.properties?.seed?.description ?? '' },
    parameters,
    formats: EXPORT_FORMAT_NAMES.map((name) => ({ name, ...EXPORT_FORMATS[name] })),
    exportOptions,
  };
}

/** zod schema of the answer (documentation). */
export const paramsDocSchema = z.object({
  seed: z.object({
    integerMax: z.int().meta({ description: 'Largest integer seed.' }),
    stringMaxChars: z.int().meta({ description: 'Longest string seed, characters.' }),
    description: z.string(),
  }),
  parameters: z.array(
    z.object({
      name: z.string().meta({ description: 'Dotted name, as in the query string of GET /v1/tracks/{seed} (widthM.min).' }),
      type: z.enum(['number', 'integer', 'choice', 'text']).meta({ description: 'number, integer (whole number), choice (one of values) or text.' }),
      unit: z.enum(Object.values(PARAM_UNITS) as [ParamUnit, ...ParamUnit[]]).nullable().meta({ description: 'm (metres), deg (degrees), m/s, m/s², or null for shares, counts and words.' }),
      min: z.number().optional().meta({ description: 'Smallest allowed value (number and integer).' }),
      max: z.number().optional().meta({ description: 'Largest allowed value (number and integer).' }),
      values: z.array(z.string()).optional().meta({ description: 'The allowed words (choice).' }),
      default: z.union([z.number(), z.string()]).nullable().meta({ description: 'Value used when left out; null when derived from other parameters.' }),
      defaultText: z.string().meta({ description: 'The default in words.' }),
      meaning: z.string(),
    }),
  ),
  formats: z.array(z.object({ name: z.string(), mediaType: z.string(), extension: z.string(), binary: z.boolean() })),
  exportOptions: z.array(
    z.object({
      name: z.string(),
      format: z.string().meta({ description: 'The format the option belongs to.' }),
      type: z.enum(['boolean', 'integer', 'string']),
      values: z.array(z.string()).optional(),
      min: z.number().optional(),
      max: z.number().optional(),
      description: z.string(),
    }),
  ),
});

function leafDoc(name: string, unit: ParamUnit | null, node: JsonSchemaNode, inherited: unknown): ParamDoc {
  const description = node.description ?? '';
  const own = isScalar(node.default) ? node.default : isScalar(inherited) ? inherited : null;
  const words = /Default: (.+?)\.?$/.exec(description)?.[1];
  // the meaning is the description without the unit, range and default it ends with
  const meaning = description.split(' Unit:')[0].replace(/ Default: .*$/, '');
  const base = { name, default: own, defaultText: own !== null ? String(own) : (words ?? 'derived'), meaning };
  if (node.enum !== undefined) return { ...base, type: 'choice', unit: null, values: node.enum };
  if ((node.type === 'number' || node.type === 'integer') && node.minimum !== undefined && node.maximum !== undefined) {
    return { ...base, type: node.type, unit, min: node.minimum, max: node.maximum };
  }
  // anything else is written as text and checked by the service
  return { ...base, type: 'text', unit };
}

function isScalar(value: unknown): value is number | string {
  return typeof value === 'number' || typeof value === 'string';
}

// the unit a name's suffix says: lengthM → m, curvatureBudgetDeg → deg; min, max, noise → none
function unitOf(name: string): ParamUnit | null {
  for (const [suffix, unit] of Object.entries(PARAM_UNITS)) {
    if (name.length > suffix.length && name.endsWith(suffix) && /[a-z]/.test(name[name.length - suffix.length - 1])) return unit;
  }
  return null;
}

// a schema registered as an OpenAPI component comes out as a $ref to its $defs entry
function resolveRoot(node: JsonSchemaNode): JsonSchemaNode {
  const name = node.$ref?.replace('#/$defs/', '');
  return name !== undefined && node.$defs?.[name] !== undefined ? node.$defs[name] : node;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
