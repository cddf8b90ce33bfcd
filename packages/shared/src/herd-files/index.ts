export * from './csv-columns';
export * from './import-check';
export * from './herd-files-dto';
