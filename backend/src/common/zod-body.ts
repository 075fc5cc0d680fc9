import {
  applyDecorators,
  BadRequestException,
  UsePipes,
  type ArgumentMetadata,
  type PipeTransform,
} from '@nestjs/common';
import { ApiBody, ApiQuery } from '@nestjs/swagger';
import { issueLines } from '@quietglass/shared/schemas/common';
import { z } from 'zod';

type BodySchema = Extract<Parameters<typeof ApiBody>[0], { schema: unknown }>['schema'];

/** Parses a value with a shared schema: the parsed value, or 400 with one line per problem. */
function parseOr400(schema: z.ZodType, value: unknown): unknown {
  const parsed = schema.safeParse(value);
  if (!parsed.success) throw new BadRequestException({ message: issueLines(parsed.error) });
  return parsed.data;
}

/** Validates the request body with a shared schema; other parameters pass through untouched. */
export class ZodBodyPipe implements PipeTransform {
  constructor(private readonly schema: z.ZodType) {}

  transform(value: unknown, metadata: ArgumentMetadata): unknown {
    if (metadata.type !== 'body') return value;
    // A request without a body is an empty one.
    return parseOr400(this.schema, value ?? {});
  }
}

/** Validates the whole query string (`@Query()`) with a shared schema; other parameters pass through. */
export class ZodQueryPipe implements PipeTransform {
  constructor(private readonly schema: z.ZodType) {}

  transform(value: unknown, metadata: ArgumentMetadata): unknown {
    if (metadata.type !== 'query' || metadata.data !== undefined) return value;
    return parseOr400(this.schema, value ?? {});
  }
}

/**
 * A route whose body is checked by one of the shared schemas (the same one the client's form
 * uses): 400 with one line per problem, the parsed value (trimmed, defaults filled) handed to the
 * handler, and the schema published in the OpenAPI description.
 */
export function ZodBody(schema: z.ZodType): MethodDecorator {
  // JSON Schema and OpenAPI 3.1 schema objects are the same vocabulary.
  const jsonSchema = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as BodySchema;
  return applyDecorators(ApiBody({ schema: jsonSchema }), UsePipes(new ZodBodyPipe(schema)));
}

type QuerySchema = Extract<Parameters<typeof ApiQuery>[0], { schema?: unknown }>['schema'];

/**
 * A route whose query string is checked by one of the shared schemas: its values arrive as text,
 * which the schema converts (numbers, ids); 400 with one line per problem as for a body, the
 * parsed value handed to the handler, and each parameter published in the OpenAPI description.
 */
export function ZodQuery(schema: z.ZodObject): MethodDecorator {
  const jsonSchema = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as {
    properties?: Record<string, QuerySchema>;
    required?: string[];
  };
  const parameters = Object.entries(jsonSchema.properties ?? {}).map(([name, property]) =>
    ApiQuery({
      name,
      required: jsonSchema.required?.includes(name) ?? false,
      schema: property,
    }),
  );
  return applyDecorators(...parameters, UsePipes(new ZodQueryPipe(schema)));
}
