/**
 * Messages of schema validation failures, naming the field and what it must be, e.g.
 * "body/plan/placements must be <= 65536" or "body/plan has an unknown field 'cell'".
 */
import type { FastifySchemaValidationError } from 'fastify/types/schema.js';

function describe(error: FastifySchemaValidationError, dataVar: string): string {
  const where = `${dataVar}${error.instancePath}`;
  const params = error.params as Record<string, unknown>;
  if (error.keyword === 'additionalProperties') return `${where} has an unknown field '${String(params.additionalProperty)}'`;
  if (error.keyword === 'required') return `${where} needs the field '${String(params.missingProperty)}'`;
  if (error.keyword === 'enum') {
    return `${where} must be one of ${(params.allowedValues as unknown[]).map((value) => JSON.stringify(value)).join(', ')}`;
  }
  if (error.keyword === 'const' && where.startsWith('body/') && params.allowedValue === 'file') {
    return `${where.replace(/\/type$/, '')} must be a file part`;
  }
  return `${where} ${error.message ?? 'is invalid'}`;
}

export function formatValidationErrors(errors: FastifySchemaValidationError[], dataVar: string): Error {
  return new Error(errors.map((error) => describe(error, dataVar)).join('; '));
}
