package present

import (
	"errors"
	"strings"

	"drawdown/model"
)

// FieldProblem is the line shown with an invalid field: the model's field
// error already names the field and the accepted range; another error gets
// the field's label in front.
func FieldProblem(spec model.FieldSpec, err error) string {
	var fe *model.FieldError
	if errors.As(err, &fe) {
		return fe.Error()
	}
	msg := err.Error()
	if !strings.HasPrefix(strings.ToLower(msg), strings.ToLower(spec.Label)) {
		msg = spec.Label + ": " + msg
	}
	return msg
}

// FirstProblem is the first invalid field in screen order, with its pane:
// "Hose › Hose length: …"; then a problem no field is to blame for (keyed
// ""); "" when every input is usable.
func FirstProblem(errs map[model.FieldID]error) string {
	for _, f := range model.Fields() {
		if err := errs[f.ID]; err != nil {
			return f.Pane.String() + " › " + FieldProblem(f, err)
		}
	}
	if err := errs[""]; err != nil {
		return err.Error()
	}
	return ""
}
