/**
 * The file as a whole: its header, its display-units setting, what a library may hold, and strings left open.
 */
import { CstUtils, isCompositeCstNode, isLeafCstNode, type CstNode, type LeafCstNode, type ValidationAcceptor, type ValidationChecks } from 'langium';
import { isChannel, isCriteria, isFlowTable, isLibraryHeader, isUnitsSetting, type RunnelAstType, type RunnelFile, type UnitsSetting } from '../generated/ast.js';
import { isClosedString } from '../parser/runnel-value-converter.js';
import { closestName } from './closest-name.js';
import { DIAGNOSTICS, PROPERTY_WORDS, report } from './diagnostic-messages.js';

const DISPLAY_SYSTEMS = ['SI', 'US'] as const;

/** `"Bermuda grass` with no closing quote: reported at the string. */
export function stringsMustBeClosed(file: RunnelFile, accept: ValidationAcceptor): void {
  const rootCst = file.$cstNode;
  if (rootCst === undefined) return;
  forEachLeaf(rootCst, (leaf) => {
    if (leaf.tokenType.name === 'STRING' && !isClosedString(leaf.text)) {
      report(accept, DIAGNOSTICS.stringNotClosed, {}, { node: leaf.astNode, range: leaf.range });
    }
  });
}

/** Every token of the syntax tree in order; CstUtils.flattenCst without its stream objects (this runs on every edit). */
function forEachLeaf(node: CstNode, visit: (leaf: LeafCstNode) => void): void {
  if (isCompositeCstNode(node)) {
    for (const child of node.content) forEachLeaf(child, visit);
  } else if (isLeafCstNode(node)) {
    visit(node);
  }
}

/** A file starts with `design "..."` or `library "..."`; reported at its first word. */
export function fileShouldStartWithHeader(file: RunnelFile, accept: ValidationAcceptor): void {
  if (file.header !== undefined) return;
  const rootCst = file.$cstNode;
  const firstToken = rootCst === undefined ? undefined : CstUtils.flattenCst(rootCst).find((leaf) => !leaf.hidden);
  if (firstToken === undefined) return; // An empty file is not worth a warning.
  report(accept, DIAGNOSTICS.headerMissing, {}, { node: file, range: firstToken.range });
}

/** A library holds linings and sections; channels, flows and criteria belong to designs. */
export function libraryMustHoldDefinitionsOnly(file: RunnelFile, accept: ValidationAcceptor): void {
  if (!isLibraryHeader(file.header)) return;
  for (const member of file.members ?? []) {
    const misplaced = isChannel(member)
      ? { what: 'this channel', keyword: 'channel' }
      : isFlowTable(member)
        ? { what: 'these flows', keyword: 'flows' }
        : isCriteria(member)
          ? { what: 'these criteria', keyword: 'criteria' }
          : undefined;
    if (misplaced !== undefined) report(accept, DIAGNOSTICS.libraryHoldsDefinitionsOnly, { what: misplaced.what }, { node: member, keyword: misplaced.keyword });
  }
}

/** `units SI` or `units US`, once. */
export function unitsSettingMustBeKnown(setting: UnitsSetting, accept: ValidationAcceptor): void {
  const written = setting.system;
  if (written === undefined || (DISPLAY_SYSTEMS as readonly string[]).includes(written)) return;
  const suggestion = closestName(written, DISPLAY_SYSTEMS);
  report(accept, DIAGNOSTICS.unitsSettingUnknown, { written, suggestion }, { node: setting, property: 'system' }, suggestion === undefined ? {} : { suggestion });
}

export function unitsSettingMustNotRepeat(file: RunnelFile, accept: ValidationAcceptor): void {
  const settings = (file.members ?? []).filter(isUnitsSetting);
  for (const repeated of settings.slice(1)) {
    report(accept, DIAGNOSTICS.propertyRepeated, { what: PROPERTY_WORDS['UnitsSetting'] ?? 'this setting', where: 'this file' }, { node: repeated });
  }
}

export const fileChecks: ValidationChecks<RunnelAstType> = {
  RunnelFile: [stringsMustBeClosed, fileShouldStartWithHeader, libraryMustHoldDefinitionsOnly, unitsSettingMustNotRepeat],
  UnitsSetting: unitsSettingMustBeKnown,
};
