import {
  BadRequestException,
  ConflictException,
  ForbiddenException,
  HttpException,
  NotFoundException,
} from '@nestjs/common';
import { ThrottlerException } from '@nestjs/throttler';
import { describe, expect, it } from 'vitest';
import { toErrorBody } from './http-exception.filter.js';

describe('toErrorBody: one error shape for the whole API', () => {
  it('keeps the message of domain exceptions', () => {
    expect(toErrorBody(new NotFoundException('User 7 does not exist'))).toEqual({
      statusCode: 404,
      error: 'Not Found',
      message: 'User 7 does not exist',
    });
    expect(toErrorBody(new ConflictException('taken'))).toEqual({
      statusCode: 409,
      error: 'Conflict',
      message: 'taken',
    });
    expect(toErrorBody(new ForbiddenException('no')).statusCode).toBe(403);
  });

  it('turns validation message arrays into details and a joined message', () => {
    const body = toErrorBody(new BadRequestException(['email is required', 'password must be a string']));
    expect(body).toEqual({
      statusCode: 400,
      error: 'Bad Request',
      message: 'Invalid input: email is required; password must be a string',
      details: ['email is required', 'password must be a string'],
    });
  });

  it('says plainly when a JSON body does not parse or the client is throttled', () => {
    const parse = new BadRequestException('Unexpected end of JSON input', { cause: new SyntaxError('x') });
    expect(toErrorBody(parse).message).toBe('The request body is not valid JSON');
    expect(toErrorBody(new ThrottlerException())).toEqual({
      statusCode: 429,
      error: 'Too Many Requests',
      message: 'Too many attempts; wait a minute and try again',
    });
    expect(toErrorBody(new HttpException('big', 413)).message).toBe('The request body is too large');
  });

  it('hides the internals of unexpected errors behind a 500', () => {
    const body = toErrorBody(new Error('connection string postgres://secret@db'));
    expect(body.statusCode).toBe(500);
    expect(body.message).not.toMatch(/secret/);
  });
});
