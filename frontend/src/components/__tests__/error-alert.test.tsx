import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ApiError } from '../../lib/api-client';
import { ErrorAlert } from '../error-alert';

// API contract: every error body is { statusCode, error, message, details?, requestId? }; a 5xx
// carries the request's id, which the server log names too.

describe('ErrorAlert', () => {
  it('shows the message, the details and a server error’s reference', () => {
    const error = new ApiError(500, 'Something went wrong on the server; it has been logged', [], {
      statusCode: 500,
      error: 'Internal Server Error',
      message: 'Something went wrong on the server; it has been logged',
      requestId: '0b6f3c2a-9d41-4e55-8a1e-3f2c7d9b1a60',
    });
    render(<ErrorAlert error={error} title="Not saved" />);
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toContain('Something went wrong on the server; it has been logged');
    expect(alert.textContent).toContain(
      "Reference for the shop's admin: 0b6f3c2a-9d41-4e55-8a1e-3f2c7d9b1a60",
    );
  });

  it('shows no reference for a refusal, and lists the details', () => {
    const error = new ApiError(400, 'Invalid input: a; b', ['a', 'b'], {
      statusCode: 400,
      error: 'Bad Request',
      message: 'Invalid input: a; b',
      details: ['a', 'b'],
    });
    render(<ErrorAlert error={error} />);
    const alert = screen.getByRole('alert');
    expect(alert.textContent).not.toContain('Reference');
    expect(screen.getAllByRole('listitem').map((li) => li.textContent)).toEqual(['a', 'b']);
  });
});
