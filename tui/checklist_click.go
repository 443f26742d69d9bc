package tui

import tea "charm.land/bubbletea/v2"

// Click selects the step in the list row at (x, y), relative to the pane.
func (v *ChecklistView) Click(x, y int) (tea.Cmd, *FieldEdit) {
	if len(v.cl.Steps) == 0 || v.mode != ckBrowse || y < 1 {
		return nil, nil
	}
	lay := v.layout()
	if x >= lay.listW || y > lay.listH {
		return nil, nil
	}
	rows, top := v.listRows(lay.listH)
	if i := top + y - 1; i < len(rows) && rows[i].step >= 0 {
		v.cur = rows[i].step
		return ckStepCmd(v.CurrentID()), nil
	}
	return nil, nil
}
