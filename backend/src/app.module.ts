import { Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { appConfig, type AppConfig } from './config/configuration.js';
import { dataSourceOptions } from './database/data-source.js';
import { AuditModule } from './audit/audit.module.js';
import { AuthModule } from './auth/auth.module.js';
import { BackupsModule } from './backups/backups.module.js';
import { CalculationsModule } from './calculations/calculations.module.js';
import { CalibrationModule } from './calibration/calibration.module.js';
import { ChambersModule } from './chambers/chambers.module.js';
import { RecipesModule } from './recipes/recipes.module.js';
import { CustomersModule } from './customers/customers.module.js';
import { DesignsModule } from './designs/designs.module.js';
import { HealthModule } from './health/health.module.js';
import { MailModule } from './mail/mail.module.js';
import { MaterialsModule } from './materials/materials.module.js';
import { QuotesModule } from './quotes/quotes.module.js';
import { CustomerRecordsModule } from './customer-records/customer-records.module.js';
import { ReportsModule } from './reports/reports.module.js';
import { RunsModule } from './runs/runs.module.js';
import { RunDiagnosisModule } from './runs/run-diagnosis.module.js';
import { ShopSettingsModule } from './shop-settings/shop-settings.module.js';
import { SpecMasksModule } from './spec-masks/spec-masks.module.js';
import { UsersModule } from './users/users.module.js';

@Module({
  imports: [
    ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, load: [appConfig] }),
    TypeOrmModule.forRootAsync({
      inject: [appConfig.KEY],
      useFactory: (config: AppConfig) => dataSourceOptions(config.databaseUrl),
    }),
    AuthModule,
    UsersModule,
    HealthModule,
    CustomersModule,
    MaterialsModule,
    SpecMasksModule,
    DesignsModule,
    CalculationsModule,
    ChambersModule,
    CalibrationModule,
    ShopSettingsModule,
    RecipesModule,
    RunsModule,
    RunDiagnosisModule,
    ReportsModule,
    MailModule,
    QuotesModule,
    CustomerRecordsModule,
    BackupsModule,
    AuditModule,
  ],
})
export class AppModule {}
