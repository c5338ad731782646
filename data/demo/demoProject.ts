/**
 * The demo lot lives in core/demo/ (pure data, read by the command line and the hosts alike, so
 * core never imports from data/); this module keeps the data room's path to it.
 */
export * from '../../core/demo/demoProject.ts';
