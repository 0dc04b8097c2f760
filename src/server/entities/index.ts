/** Every MikroORM entity of the app, listed explicitly (see mikro-orm.config.ts). */
import { ShopSettings } from './shop-settings.entity';

export const entities = [ShopSettings];
export { ShopSettings };
