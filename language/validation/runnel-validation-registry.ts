/**
 * Registers every Runnel check when the registry is created, so any composition of RunnelModule (core services
 * for the CLI and tests, LSP services in the server) validates the same way.
 */
import { ValidationRegistry, type LangiumCoreServices } from 'langium';
import type { RunnelAddedServices } from '../runnel-module.js';
import type { RunnelAstType } from '../generated/ast.js';
import { criteriaChecks } from './criteria-validation.js';
import { fileChecks } from './file-validation.js';
import { createFindingChecks } from './finding-validation.js';
import { liningChecks } from './lining-validation.js';
import { createNameReferenceChecks, nameChecks } from './name-validation.js';
import { reachChecks } from './reach-validation.js';
import { sectionChecks } from './section-validation.js';
import { unitChecks } from './unit-validation.js';

export class RunnelValidationRegistry extends ValidationRegistry {
  constructor(services: LangiumCoreServices & RunnelAddedServices) {
    super(services);
    const findingChecks = createFindingChecks(services.analysis.CriteriaDefaults);
    for (const checks of [fileChecks, nameChecks, unitChecks, sectionChecks, liningChecks, reachChecks, criteriaChecks, findingChecks]) {
      this.register<RunnelAstType>(checks);
    }
    this.register<RunnelAstType>(createNameReferenceChecks(services));
  }
}
