// Used by the MikroORM CLI (`npm run migration:create`). The app builds its config in server/db/orm-config.ts.
import { ormConfig } from './server/db/orm-config';

export default ormConfig(process.env.DATABASE_URL ?? 'postgres://pullbook@127.0.0.1:55432/pullbook');
