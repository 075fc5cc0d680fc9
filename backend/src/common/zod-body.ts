import {
  applyDecorators,
  BadRequestException,
  UsePipes,
  type ArgumentMetadata,
  type PipeTransform,
} from '@nestjs/common';
import { ApiBody } from '@nestjs/swagger';
import { issueLines } from '@quietglass/shared/schemas/common';
import { z } from 'zod';

type BodySchema = Extract<Parameters<typeof ApiBody>[0], { schema: unknown }>['schema'];

/** Validates the request body with a shared schema; other parameters pass through untouched. */
export class ZodBodyPipe implements PipeTransform {
  constructor(private readonly schema: z.ZodType) {}

  transform(value: unknown, metadata: ArgumentMetadata): unknown {
    if (metadata.type !== 'body') return value;
    // A request without a body is an empty one, as the class-validator pipe took it.
    const parsed = this.schema.safeParse(value ?? {});
    if (!parsed.success) throw new BadRequestException({ message: issueLines(parsed.error) });
    return parsed.data;
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
