import { BadRequestException } from '@nestjs/common';
import { Type } from 'class-transformer';
import { IsInt, IsString, Max, Min, ValidateNested } from 'class-validator';
import { toErrorBody } from './all-exceptions.filter.js';
import { createValidationPipe } from './validation.js';

class AxisDto {
  @IsString()
  parameter!: string;

  @IsInt()
  @Min(2)
  @Max(512)
  steps!: number;
}

class SweepDto {
  @IsString()
  name!: string;

  @ValidateNested({ each: true })
  @Type(() => AxisDto)
  axes!: AxisDto[];
}

const pipe = createValidationPipe();
const meta = { type: 'body' as const, metatype: SweepDto };

async function rejection(value: unknown): Promise<ReturnType<typeof toErrorBody>> {
  try {
    await pipe.transform(value, meta);
  } catch (err) {
    expect(err).toBeInstanceOf(BadRequestException);
    return toErrorBody(err);
  }
  throw new Error('expected the pipe to reject the value');
}

describe('global validation pipe', () => {
  it('turns a valid body into a DTO instance (transform)', async () => {
    const out = await pipe.transform({ name: 'cut', axes: [{ parameter: 'g', steps: 10 }] }, meta);
    expect(out).toBeInstanceOf(SweepDto);
    expect((out as SweepDto).axes[0]).toBeInstanceOf(AxisDto);
  });

  it('names the JSON path of a bad nested field', async () => {
    const body = await rejection({ name: 'cut', axes: [{ parameter: 'g', steps: 10 }, { parameter: 'J', steps: 1 }] });
    expect(body.statusCode).toBe(400);
    expect(body.error).toBe('Bad Request');
    expect(body.message).toContain('axes.1.steps');
    expect(body.details).toEqual([{ path: 'axes.1.steps', problems: ['steps must not be less than 2'] }]);
  });

  it('rejects unknown fields instead of silently dropping them (forbidNonWhitelisted)', async () => {
    const body = await rejection({ name: 'cut', axes: [], colour: 'red' });
    expect(body.details).toEqual([{ path: 'colour', problems: ['property colour should not exist'] }]);
  });
});

describe('error body of unexpected failures', () => {
  it('hides internals behind a 500 with the one shape', () => {
    const body = toErrorBody(new TypeError('cannot read x of undefined'));
    expect(body).toEqual({
      statusCode: 500,
      error: 'Internal Server Error',
      message: 'Internal server error; the server log has the details',
      details: null,
    });
  });
});
