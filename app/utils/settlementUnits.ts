// Settlement display units live with the plots (shared by the pages and the PDF reports).
export { settlementFactor, settlementUnitLabel, settlementShow, formatSettlement, formatYears, formatDistortion, formatPlanAt } from '#shared/plots/settlement-units'
