import type { MigrationInterface, QueryRunner } from 'typeorm';

export class CreateAccounts1767200000000 implements MigrationInterface {
  name = 'CreateAccounts1767200000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE accounts (
        id uuid NOT NULL DEFAULT gen_random_uuid(),
        role varchar(16) NOT NULL,
        status varchar(16) NOT NULL,
        handle varchar(32) NOT NULL,
        email varchar(254) NOT NULL,
        display_name varchar(80) NOT NULL,
        business varchar(120) NOT NULL,
        town varchar(80) NOT NULL,
        country varchar(80) NOT NULL,
        password_hash varchar(255),
        email_verified_at timestamptz,
        verified_at timestamptz,
        status_reason varchar(500),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT pk_accounts PRIMARY KEY (id),
        CONSTRAINT ck_accounts_role CHECK (role IN ('dealer', 'assessor', 'registrar')),
        CONSTRAINT ck_accounts_status CHECK (status IN ('pending', 'verified', 'rejected', 'suspended', 'closed')),
        CONSTRAINT ck_accounts_handle CHECK (handle ~ '^[a-z0-9][a-z0-9-]{1,30}[a-z0-9]$')
      )`);
    await q.query(`CREATE UNIQUE INDEX uq_accounts_handle ON accounts (handle)`);
    await q.query(`CREATE UNIQUE INDEX uq_accounts_email_lower ON accounts (lower(email))`);
    await q.query(`CREATE INDEX ix_accounts_status_created ON accounts (status, created_at)`);

    await q.query(`
      CREATE TABLE sessions (
        id uuid NOT NULL DEFAULT gen_random_uuid(),
        account_id uuid NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        revoked_at timestamptz,
        revoked_why varchar(32),
        CONSTRAINT pk_sessions PRIMARY KEY (id),
        CONSTRAINT fk_sessions_account FOREIGN KEY (account_id) REFERENCES accounts (id) ON DELETE CASCADE
      )`);
    await q.query(`CREATE INDEX ix_sessions_account ON sessions (account_id)`);

    await q.query(`
      CREATE TABLE refresh_tokens (
        id uuid NOT NULL DEFAULT gen_random_uuid(),
        session_id uuid NOT NULL,
        token_hash char(64) NOT NULL,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT pk_refresh_tokens PRIMARY KEY (id),
        CONSTRAINT fk_refresh_tokens_session FOREIGN KEY (session_id) REFERENCES sessions (id) ON DELETE CASCADE
      )`);
    await q.query(`CREATE UNIQUE INDEX uq_refresh_tokens_hash ON refresh_tokens (token_hash)`);
    await q.query(`CREATE INDEX ix_refresh_tokens_session ON refresh_tokens (session_id)`);

    await q.query(`
      CREATE TABLE email_tokens (
        id uuid NOT NULL DEFAULT gen_random_uuid(),
        account_id uuid NOT NULL,
        purpose varchar(16) NOT NULL,
        token_hash char(64) NOT NULL,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT pk_email_tokens PRIMARY KEY (id),
        CONSTRAINT ck_email_tokens_purpose CHECK (purpose IN ('verify-email', 'reset-password', 'set-password')),
        CONSTRAINT fk_email_tokens_account FOREIGN KEY (account_id) REFERENCES accounts (id) ON DELETE CASCADE
      )`);
    await q.query(`CREATE UNIQUE INDEX uq_email_tokens_hash ON email_tokens (token_hash)`);
    await q.query(`CREATE INDEX ix_email_tokens_account ON email_tokens (account_id, purpose)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE email_tokens`);
    await q.query(`DROP TABLE refresh_tokens`);
    await q.query(`DROP TABLE sessions`);
    await q.query(`DROP TABLE accounts`);
  }
}
