// Former name of ./sample-span.ts, kept so existing imports keep working; import from './sample-span.js'.
export * from './sample-span.js';
