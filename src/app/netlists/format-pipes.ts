/**
 * The formatting helpers of `format.ts` as template pipes, so tables write `t | ago` instead of
 * each component wrapping the same functions.
 */
import { Pipe, type PipeTransform } from '@angular/core';
import { absoluteTime, formatSize, relativeTime } from './format';

/** An ISO time as "3 min ago" / "in 6 days". */
@Pipe({ name: 'ago' })
export class AgoPipe implements PipeTransform {
  transform(iso: string | null | undefined): string {
    return iso ? relativeTime(iso) : '';
  }
}

/** An ISO time as "12 Mar 2026, 14:05", for title attributes. */
@Pipe({ name: 'exactTime' })
export class ExactTimePipe implements PipeTransform {
  transform(iso: string | null | undefined): string {
    return iso ? absoluteTime(iso) : '';
  }
}

/** A size in bytes as "812 B" / "4.2 kB". */
@Pipe({ name: 'bytes' })
export class BytesPipe implements PipeTransform {
  transform(bytes: number): string {
    return formatSize(bytes);
  }
}
