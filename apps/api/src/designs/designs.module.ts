import { Module } from '@nestjs/common';
import { GeometryModule } from '../geometry/geometry.module';
import { TypeOrmModule } from '@nestjs/typeorm';
import { Design } from './design.entity';
import { DesignsController } from './designs.controller';
import { DesignsService } from './designs.service';

@Module({
  imports: [TypeOrmModule.forFeature([Design]), GeometryModule],
  controllers: [DesignsController],
  providers: [DesignsService],
  exports: [DesignsService, TypeOrmModule],
})
export class DesignsModule {}
