import { Global, Module } from '@nestjs/common';
import { ConfigModule, type ConfigType } from '@nestjs/config';
import { FsStorage } from './fs-storage';
import { OBJECT_STORAGE } from './object-storage';
import { S3Storage } from './s3-storage';
import { storageConfig } from './storage.config';

@Global()
@Module({
  imports: [ConfigModule.forFeature(storageConfig)],
  providers: [
    {
      provide: OBJECT_STORAGE,
      inject: [storageConfig.KEY],
      useFactory: (c: ConfigType<typeof storageConfig>) =>
        c.driver === 'fs' ? new FsStorage(c.dir) : new S3Storage(c),
    },
  ],
  exports: [OBJECT_STORAGE],
})
export class StorageModule {}
