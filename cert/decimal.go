package cert

// smallDecimal parses a canonical decimal integer of at most 7 digits at
// d[p:], returning its value and the index after it. The byte there (if
// any) may still be a digit: the caller checks what follows.
func smallDecimal(d []byte, p int) (n, q int, ok bool) {
	q = p
	for q < len(d) && q-p < 7 && d[q]-'0' <= 9 {
		n = n*10 + int(d[q]-'0')
		q++
	}
	return n, q, q > p && (d[p] != '0' || q == p+1)
}

// nextDecimal turns the decimal text of k ≥ 0 into that of k+1; counting
// up is cheaper than formatting every number.
func nextDecimal(c []byte) []byte {
	for i := len(c) - 1; i >= 0; i-- {
		if c[i] != '9' {
			c[i]++
			return c
		}
		c[i] = '0'
	}
	return append([]byte{'1'}, c...)
}

// decimalWidth returns the number of digits of k ≥ 0.
func decimalWidth(k int) int {
	w := 1
	for k >= 10 {
		k /= 10
		w++
	}
	return w
}
