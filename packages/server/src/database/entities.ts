// Every TypeORM entity, listed explicitly (no globbing): add a feature's entities here.
export const ENTITIES: Array<new (...args: never[]) => object> = [];
