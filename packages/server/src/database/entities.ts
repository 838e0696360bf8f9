import { Account } from '../accounts/entities/account.entity';
import { EmailToken } from '../accounts/entities/email-token.entity';
import { RefreshToken, Session } from '../accounts/entities/session.entity';

// Every TypeORM entity, listed explicitly (no globbing): add a feature's entities here.
export const ENTITIES: Array<new (...args: never[]) => object> = [Account, Session, RefreshToken, EmailToken];
