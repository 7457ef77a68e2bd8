/**
 * Materials of a work order: what each measure needs (its quantity × the library's use per
 * unit), and the bill of materials across measures, summed per material and rounded up to
 * whole purchase units (tubes, cans, sheets, pails; whole feet for goods bought by length).
 */
import { materialOf, type MaterialId } from '../measure-library/materials.ts';
import type { MeasureType } from '../measure-library/types.ts';
import { Decimal } from '../money.ts';

/** One material one measure needs. */
export interface MaterialNeed {
  materialId: MaterialId;
  name: string;
  /** In the material's use unit (ft of bead, ft², each). */
  quantity: number;
  useUnitWords: string;
}

/** One line of the bill of materials. */
export interface BillLine {
  materialId: MaterialId;
  name: string;
  /** Σ over measures of quantity × use per unit, in the use unit. */
  useQuantity: number;
  useUnitWords: string;
  /** Whole purchase units to buy: ⌈useQuantity / yield⌉. */
  purchaseCount: number;
  /** The purchase unit in words, singular or plural to match the count. */
  purchaseUnitWords: string;
  yieldPerPurchaseUnit: number;
  /** How the yield was found. */
  yieldWorking: string;
  /** Measures that use it, in work-order order. */
  measureIds: string[];
}

/**
 * What one measure needs.
 *
 * @param type - its library type (materials per unit of the measure)
 * @param quantity - the measure's quantity in the type's unit (ft, ft², each, job)
 * @returns one need per material the type lists; empty when it lists none
 *
 * Notes: need = quantity × quantityPerUnit, in Decimal so sums of decimal quantities are
 * exact before rounding up.
 */
export function materialNeeds(type: MeasureType, quantity: number): MaterialNeed[] {
  return (type.materials ?? []).map((use) => {
    const material = materialOf(use.materialId);
    return {
      materialId: use.materialId,
      name: material.name,
      quantity: new Decimal(quantity).times(use.quantityPerUnit).toNumber(),
      useUnitWords: material.useUnitWords,
    };
  });
}

/**
 * The bill of materials of a work order.
 *
 * @param measures - each measure's id and needs, in work-order order
 * @returns one line per material, in the order first needed
 *
 * Notes: useQuantity = Σ need.quantity; purchaseCount = ⌈useQuantity / yield⌉, computed in
 * Decimal so an exact whole number of tubes is not pushed up by float rounding.
 */
export function billOfMaterials(
  measures: readonly { id: string; needs: readonly MaterialNeed[] }[],
): BillLine[] {
  const totals = new Map<MaterialId, { sum: Decimal; measureIds: string[] }>();
  for (const measure of measures) {
    for (const need of measure.needs) {
      const line = totals.get(need.materialId) ?? { sum: new Decimal(0), measureIds: [] };
      line.sum = line.sum.plus(need.quantity);
      if (!line.measureIds.includes(measure.id)) line.measureIds.push(measure.id);
      totals.set(need.materialId, line);
    }
  }
  return [...totals.entries()].map(([materialId, { sum, measureIds }]) => {
    const material = materialOf(materialId);
    const purchaseCount = sum.dividedBy(material.yieldPerPurchaseUnit).ceil().toNumber();
    return {
      materialId,
      name: material.name,
      useQuantity: sum.toNumber(),
      useUnitWords: material.useUnitWords,
      purchaseCount,
      purchaseUnitWords:
        purchaseCount === 1 ? material.purchaseUnit.one : material.purchaseUnit.many,
      yieldPerPurchaseUnit: material.yieldPerPurchaseUnit,
      yieldWorking: material.yieldWorking,
      measureIds,
    };
  });
}
