package suggest

import "testing"

func TestDistance(t *testing.T) {
	cases := []struct {
		a, b string
		want int
	}{
		{"", "", 0}, {"amout", "amount", 1}, {"kitten", "sitting", 3}, {"µM", "uM", 1}, {"flaw", "lawn", 2},
	}
	for _, c := range cases {
		if got := Distance(c.a, c.b); got != c.want {
			t.Errorf("Distance(%q, %q) = %d, want %d", c.a, c.b, got, c.want)
		}
	}
}

func TestNearest(t *testing.T) {
	keys := []string{"amount", "stock", "tolerance", "use"}
	cases := []struct{ in, want string }{
		{"amout", "amount"}, {"Stok", "stock"}, {"tolerence", "tolerance"}, {"colour", ""}, {"", ""},
	}
	for _, c := range cases {
		if got := Nearest(c.in, keys); got != c.want {
			t.Errorf("Nearest(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}
