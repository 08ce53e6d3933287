// Feed design: the method is described at the top of ./design-feeds.ts.
export * from './design-feeds';
