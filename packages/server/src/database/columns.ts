import {
  Column,
  type ColumnOptions,
  CreateDateColumn,
  JoinColumn,
  ManyToOne,
  type ObjectType,
  OneToOne,
  PrimaryColumn,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';

/**
 * The column kinds our tables share, as TypeORM decorators. They only describe what the
 * migrations create (TypeORM never synchronizes here): each column is named after its property in
 * snake_case (`displayName` → `display_name`), so renaming a property renames the column it reads
 * and wants a migration.
 */
export type ColumnExtras = Pick<ColumnOptions, 'nullable' | 'default' | 'select' | 'array' | 'transformer'>;

function snakeCase(property: string): string {
  return property.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);
}

function typed(options: ColumnOptions): PropertyDecorator {
  return (target, property) => Column({ name: snakeCase(String(property)), ...options })(target, property);
}

/** `id uuid`, generated, as the primary key `pk_<table>`. */
export function UuidPrimary(table: string): PropertyDecorator {
  return PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: `pk_${table}` });
}

/**
 * `lot_id uuid` or `entry_id bigint` as (part of) the primary key `pk_<table>`: a row that shares
 * the key of the lot or entry it belongs to (see {@link BelongsTo}).
 */
export function SharedKey(table: string, column: 'lot_id' | 'entry_id'): PropertyDecorator {
  const type = column === 'lot_id' ? 'uuid' : 'bigint';
  return PrimaryColumn({ name: column, type, primaryKeyConstraintName: `pk_${table}` });
}

/** `id bigint GENERATED ALWAYS AS IDENTITY`, the primary key `pk_<table>` (read as a string). */
export function IdentityPrimary(table: string): PropertyDecorator {
  return PrimaryGeneratedColumn('identity', {
    type: 'bigint',
    generatedIdentity: 'ALWAYS',
    primaryKeyConstraintName: `pk_${table}`,
  });
}

/** `created_at timestamptz`, set by the database on insert. */
export function CreatedAt(): PropertyDecorator {
  return CreateDateColumn({ name: 'created_at', type: 'timestamptz' });
}

/** `updated_at timestamptz`, set on every save through TypeORM. */
export function UpdatedAt(): PropertyDecorator {
  return UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' });
}

/** A `timestamptz`; `now` gives it the database's `now()` default. */
export function Timestamp(extras: ColumnExtras & { now?: boolean } = {}): PropertyDecorator {
  const { now, ...rest } = extras;
  return typed({ type: 'timestamptz', ...(now ? { default: () => 'now()' } : {}), ...rest });
}

/** A `varchar(length)`. */
export function Varchar(length: number, extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'varchar', length, ...extras });
}

/** A `text`. */
export function Text(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'text', ...extras });
}

/** An `integer`. */
export function Integer(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'integer', ...extras });
}

/** A `boolean`. */
export function Boolean(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'boolean', ...extras });
}

/** A `uuid` (an account's or a row's id kept as a reference). */
export function Uuid(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'uuid', ...extras });
}

/** A `jsonb`. */
export function Jsonb(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'jsonb', ...extras });
}

/** A SHA-256 in lower-case hex: `char(64)`. */
export function Sha256(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'char', length: 64, ...extras });
}

/**
 * An account id as rolls write it (`varchar(64)`): opaque, deliberately no foreign key, since it
 * may be the service's own actor and a roll outlives any account row.
 */
export function Actor(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'varchar', length: 64, ...extras });
}

/** A canonical lot code: `varchar(9)`. */
export function LotCode(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'varchar', length: 9, ...extras });
}

/** A short word from a closed list (a status, a role, a purpose): `varchar(16)`. */
export function Word(extras: ColumnExtras = {}): PropertyDecorator {
  return typed({ type: 'varchar', length: 16, ...extras });
}

/** `lot_id uuid`: the lot a row is about. */
export function LotId(): PropertyDecorator {
  return typed({ type: 'uuid' });
}

/**
 * The link from a row of `table` to the row of `target` it belongs to, through its column `column`
 * (`lot_id`, `entry_id`), under the foreign key `fk_<table>_<lot|entry>` with the migration's
 * `onDelete` rule; `one` when the row shares that row's key (one-to-one), else many-to-one.
 */
export function BelongsTo<T>(
  target: () => ObjectType<T>,
  table: string,
  column: 'lot_id' | 'entry_id',
  rule: { onDelete: 'RESTRICT' | 'CASCADE'; one?: boolean },
): PropertyDecorator {
  const relation = (rule.one ? OneToOne : ManyToOne)(target, { onDelete: rule.onDelete });
  const join = JoinColumn({ name: column, foreignKeyConstraintName: `fk_${table}_${column.slice(0, -3)}` });
  return (proto, property) => {
    join(proto, property);
    relation(proto, property);
  };
}

/**
 * The columns a row kept about one lot starts with (an offer, a sale, an invitation, a request):
 * its own `id uuid` under the primary key `pk_<table>`, then the lot's id and canonical code.
 * Entities extend the class it returns.
 */
export function LotRowColumns(table: string) {
  abstract class LotRow {
    @UuidPrimary(table)
    id: string;

    @LotId()
    lotId: string;

    @LotCode()
    code: string;
  }
  return LotRow;
}
