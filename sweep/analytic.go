package sweep

// AxisMarginRows returns, with a second axis, the margin of every grid
// point at every axis value, one row per axis value (nil without an axis).
func (c *ComboResult) AxisMarginRows() [][]float64 { return c.AxisMargins }

// AxisMeasureRows returns, with a second axis, each study measure at model
// scale over the grid, one row per axis value (nil without an axis).
func (c *ComboResult) AxisMeasureRows() map[string][][]float64 { return c.AxisMeasures }
