import { describe, it, expect } from 'vitest';
import { CalculationError, requireFinite, requireNonNegative, requirePositive } from '../../../shared/calc/errors';

describe('CalculationError', () => {
  it('when created with a field, then it carries the message, the field and its own name', () => {
    const error = new CalculationError('Bore must be greater than zero.', 'bore');
    expect(error).toBeInstanceOf(Error);
    expect(error.name).toBe('CalculationError');
    expect(error.message).toBe('Bore must be greater than zero.');
    expect(error.field).toBe('bore');
  });

  it('when created without a field, then the field is undefined', () => {
    expect(new CalculationError('Something is off.').field).toBeUndefined();
  });
});

describe('input guards', () => {
  it.each([
    { guard: requireFinite, value: -3 },
    { guard: requireFinite, value: 0 },
    { guard: requirePositive, value: 0.001 },
    { guard: requireNonNegative, value: 0 },
  ])('when $guard.name is given $value, then it returns the value', ({ guard, value }) => {
    expect(guard(value, 'x', 'X')).toBe(value); // derived: a valid value passes through unchanged
  });

  it.each([
    { guard: requireFinite, value: Number.NaN, message: 'X must be a finite number.' },
    { guard: requireFinite, value: Number.NEGATIVE_INFINITY, message: 'X must be a finite number.' },
    { guard: requireFinite, value: '4', message: 'X must be a finite number.' },
    { guard: requireFinite, value: undefined, message: 'X must be a finite number.' },
    { guard: requirePositive, value: 0, message: 'X must be greater than zero.' },
    { guard: requirePositive, value: -1, message: 'X must be greater than zero.' },
    { guard: requirePositive, value: Number.POSITIVE_INFINITY, message: 'X must be a finite number.' },
    { guard: requireNonNegative, value: -0.001, message: 'X cannot be negative.' },
    { guard: requireNonNegative, value: Number.NaN, message: 'X must be a finite number.' },
  ])('when $guard.name is given $value, then it throws "$message" naming the field', ({ guard, value, message }) => {
    let caught: unknown;
    try {
      guard(value, 'x', 'X');
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(CalculationError);
    expect((caught as CalculationError).message).toBe(message);
    expect((caught as CalculationError).field).toBe('x');
  });
});
