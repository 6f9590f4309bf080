/** Every TypeORM entity, listed once; feature modules add theirs here. */
export const ENTITIES: Function[] = [];
