package units

// parse reads s as the quantity Q described by t.
func parse[Q ~float64](t *table, s string) (Q, error) {
	v, err := t.parse(s)
	return Q(v), err
}

// unmarshal stores the parsed text in *q; *q is left unchanged on error.
func unmarshal[Q ~float64](q *Q, t *table, text []byte) error {
	v, err := t.parse(string(text))
	if err != nil {
		return err
	}
	*q = Q(v)
	return nil
}
