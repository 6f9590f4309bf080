import { SetMetadata } from '@nestjs/common';

export const IS_PUBLIC_KEY = 'gyre:isPublic';

/** Opts a route out of the global sign-in guard. */
export const Public = (): MethodDecorator & ClassDecorator => SetMetadata(IS_PUBLIC_KEY, true);
