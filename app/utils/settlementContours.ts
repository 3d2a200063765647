// The contour bands live with the plots (shared by the results map and the PDF report).
export { settlementColour, contourThresholds, settlementBands, gridToPlan, bandPath, type ContourBand } from '#shared/plots/settlement-contours'
