package backward

// term is one summand n·x^i·y^j of the polynomial form shared by every equation here. Each
// table's sum is generated straight-line code (poly_gen.go, by ../polygen).
// Exponents are small integers; where a release uses quarter exponents the table stores 4·I
// and says so.
type term struct {
	i, j int8
	n    float64
}
