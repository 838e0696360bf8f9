import type { Type } from '@nestjs/common';
import { ApiProperty } from '@nestjs/swagger';

/**
 * One page of a list the server pages, sorts and filters: the items, the count of all matches,
 * and the page asked for. Each list extends `Page(Item)` under its own schema name; the class
 * made here is never a schema itself.
 */
export function Page<T>(item: Type<T>) {
  abstract class PageOf {
    @ApiProperty({ type: [item] }) items: T[];
    @ApiProperty() total: number;
    @ApiProperty() page: number;
    @ApiProperty() pageSize: number;
  }
  return PageOf;
}
