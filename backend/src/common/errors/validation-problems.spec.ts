import 'reflect-metadata';
import { Type } from 'class-transformer';
import { IsInt, IsString, Min, ValidateNested, validateSync } from 'class-validator';
import { plainToInstance } from 'class-transformer';
import { ErrorKind } from './gyre.exception';
import { validationExceptionFactory, validationProblems } from './validation-problems';

class Item {
  @IsString()
  name!: string;

  @IsInt()
  @Min(1)
  count!: number;
}

class Order {
  @IsString()
  label!: string;

  @ValidateNested({ each: true })
  @Type(() => Item)
  items!: Item[];
}

// class-validator itself produces the error tree; nothing is hand-made here.
function errorsOf(plain: unknown) {
  return validateSync(plainToInstance(Order, plain) as object);
}

describe('validation problems', () => {
  it('flattens nested errors to { field, reason } with the path, as Nest words the message', () => {
    const problems = validationProblems(
      errorsOf({
        label: 7,
        items: [
          { name: 'a', count: 2 },
          { name: 3, count: 0 },
        ],
      }),
    );
    expect(problems).toEqual([
      { field: 'label', reason: 'label must be a string' },
      { field: 'items.1.name', reason: 'items.1.name must be a string' },
      { field: 'items.1.count', reason: 'items.1.count must not be less than 1' },
    ]);
  });

  it('is a 400 VALIDATION_FAILED carrying the items and the reasons as its message', () => {
    const exception = validationExceptionFactory(
      errorsOf({ label: 'x', items: [{ name: 1, count: 1 }] }),
    );
    expect(exception.kind).toBe(ErrorKind.BadInput);
    expect(exception.code).toBe('VALIDATION_FAILED');
    expect(exception.message).toBe('items.0.name must be a string');
    expect(exception.details).toEqual({
      problems: [{ field: 'items.0.name', reason: 'items.0.name must be a string' }],
    });
  });

  it('gives nothing for a valid object', () => {
    expect(validationProblems(errorsOf({ label: 'x', items: [{ name: 'a', count: 1 }] }))).toEqual(
      [],
    );
  });
});
