/**
 * Fastify's validator compiler for the protocol's checks: a route's `schema.body` (or
 * `querystring`) is a Check from schema/sync-protocol.ts, and the checked, typed value replaces
 * the raw one, so a handler only ever sees a request that passed.
 */
import type { FastifySchemaCompiler } from 'fastify';
import { type Check, SchemaError } from '../schema/check.ts';

export const checkCompiler: FastifySchemaCompiler<Check<unknown>> = ({ schema, httpPart }) => {
  const part = httpPart === 'querystring' ? 'query' : (httpPart ?? 'request');
  return (data: unknown) => {
    try {
      return { value: schema(data, part) };
    } catch (e) {
      if (e instanceof SchemaError) return { error: e };
      throw e;
    }
  };
};
