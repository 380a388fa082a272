import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, Max, Min } from 'class-validator';

export const MAX_PAGE_SIZE = 200;
/** Highest page number accepted: far past any real table, and keeps OFFSET a plain integer in SQL. */
export const MAX_PAGE = 1_000_000;

/** `page` and `pageSize` of every table endpoint; list queries extend it with their sort and filters. */
export class PageQueryDto {
  @ApiPropertyOptional({ minimum: 1, maximum: MAX_PAGE, default: 1 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(MAX_PAGE)
  page?: number;

  @ApiPropertyOptional({ minimum: 1, maximum: MAX_PAGE_SIZE, default: 25 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(MAX_PAGE_SIZE)
  pageSize?: number;
}

/** The page asked for, with defaults, as offset and limit. */
export function pageWindow(query: PageQueryDto, defaultSize = 25) {
  const page = query.page ?? 1;
  const pageSize = query.pageSize ?? defaultSize;
  return { page, pageSize, skip: (page - 1) * pageSize, take: pageSize };
}

/** A `sort` value (a field, `-` prefixed for descending) as a column and direction. */
export function sortOrder(
  sort: string,
  columns: Readonly<Record<string, string>>,
  fallback: string,
): [string, 'ASC' | 'DESC'] {
  const desc = sort.startsWith('-');
  return [columns[desc ? sort.slice(1) : sort] ?? fallback, desc ? 'DESC' : 'ASC'];
}
