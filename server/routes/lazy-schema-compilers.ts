/**
 * Route schemas compiled on first use instead of at start. Fastify compiles every route's request validator (Ajv)
 * and response serializer (fast-json-stringify) while the server gets ready: with about thirty routes that was the
 * largest part of a start (1.3 s of 4.7 s of the start's profiled CPU on the loaded development machine, plus
 * 0.5 s to load Ajv), and a restart after a crash waited for it. These factories hand Fastify the very compilers it uses by default
 * (@fastify/ajv-compiler, @fastify/fast-json-stringify-compiler, same options, same external schemas), each wrapped so
 * that a route's schema is compiled the first time a request needs it (a few ms, once per route and status), and Ajv
 * itself is loaded only then. Validation results, error objects and serialized bodies are the defaults' own.
 * Fastify's docs: "Validation and Serialization", schemaController.compilersFactory.
 */
import { createRequire } from 'node:module';
import type { FastifyServerOptions } from 'fastify';

type CompilersFactory = NonNullable<NonNullable<FastifyServerOptions['schemaController']>['compilersFactory']>;
type ValidatorFactory = NonNullable<CompilersFactory['buildValidator']>;
type SerializerFactory = NonNullable<CompilersFactory['buildSerializer']>;
type ValidatorCompiler = ReturnType<ValidatorFactory>;
type SerializerCompiler = ReturnType<SerializerFactory>;
type ValidateFunction = ((data: unknown) => unknown) & { errors?: unknown };

const require = createRequire(import.meta.url);

/** The default Ajv validator factory of Fastify, built on the first compile. */
function lazyValidatorFactory(): ValidatorFactory {
  let selector: ValidatorFactory | null = null;
  return (externalSchemas, options) => {
    let compiler: ValidatorCompiler | null = null;
    return (route) => {
      let validate: ValidateFunction | null = null;
      const lazy: ValidateFunction = (data) => {
        if (validate === null) {
          selector ??= (require('@fastify/ajv-compiler') as () => ValidatorFactory)();
          compiler ??= selector(externalSchemas, options);
          validate = compiler(route) as ValidateFunction;
        }
        const result = validate(data);
        // Fastify reads the errors from the function it was given
        lazy.errors = validate.errors;
        return result;
      };
      return lazy as ReturnType<ValidatorCompiler>;
    };
  };
}

/** The default fast-json-stringify serializer factory of Fastify, each route's serializer built on first use. */
function lazySerializerFactory(): SerializerFactory {
  let selector: SerializerFactory | null = null;
  return (externalSchemas, options) => {
    let compiler: SerializerCompiler | null = null;
    return (route) => {
      let serialize: ((data: unknown) => string) | null = null;
      return (data: unknown) => {
        if (serialize === null) {
          selector ??= (require('@fastify/fast-json-stringify-compiler') as () => SerializerFactory)();
          compiler ??= selector(externalSchemas, options);
          serialize = compiler(route) as (data: unknown) => string;
        }
        return serialize(data);
      };
    };
  };
}

/** Fastify's `schemaController` option with both compilers lazy. */
export function lazySchemaController(): NonNullable<FastifyServerOptions['schemaController']> {
  return { compilersFactory: { buildValidator: lazyValidatorFactory(), buildSerializer: lazySerializerFactory() } };
}
