import {
  type ArgumentsHost,
  BadRequestException,
  ConflictException,
  ForbiddenException,
  HttpException,
  NotFoundException,
} from '@nestjs/common';
import { ThrottlerException } from '@nestjs/throttler';
import { describe, expect, it } from 'vitest';
import { AllExceptionsFilter, toErrorBody } from './http-exception.filter.js';

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

describe('AllExceptionsFilter: a server error names its request', () => {
  function fakeHost(requestId: string | undefined) {
    const sent: { status?: number; body?: unknown; headers: Record<string, string> } = { headers: {} };
    const res = {
      setHeader: (k: string, v: string) => (sent.headers[k] = v),
      status(code: number) {
        sent.status = code;
        return this;
      },
      json(body: unknown) {
        sent.body = body;
      },
    };
    const req = { method: 'GET', originalUrl: '/api/designs/4?x=secret', requestId };
    const host = {
      switchToHttp: () => ({ getResponse: () => res, getRequest: () => req }),
    } as unknown as ArgumentsHost;
    return { host, sent };
  }

  it('logs the method, path and request id of an unexpected error and answers the id', () => {
    const { host, sent } = fakeHost('7f9c2b1e-request');
    const logged: string[] = [];
    const filter = new AllExceptionsFilter();
    (filter as unknown as { logger: { error: (m: string) => void } }).logger = {
      error: (m: string) => logged.push(m),
    };
    filter.catch(new Error('boom'), host);
    expect(sent.status).toBe(500);
    expect(sent.body).toEqual({
      statusCode: 500,
      error: 'Internal Server Error',
      message: 'Something went wrong on the server; it has been logged',
      requestId: '7f9c2b1e-request',
    });
    expect(logged).toHaveLength(1);
    // The query string stays out of the log (it may carry search terms or tokens).
    expect(logged[0]).toMatch(/^GET \/api\/designs\/4 \[request 7f9c2b1e-request\]: Error: boom/);
  });

  it('gives no request id with an ordinary refusal', () => {
    const { host, sent } = fakeHost('7f9c2b1e-request');
    new AllExceptionsFilter().catch(new NotFoundException('Design 4 does not exist'), host);
    expect(sent.status).toBe(404);
    expect(sent.body).toEqual({ statusCode: 404, error: 'Not Found', message: 'Design 4 does not exist' });
  });
});
