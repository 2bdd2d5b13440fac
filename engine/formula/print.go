package formula

import "strings"

// String prints the tree in a bracketed prefix form, one node per bracket:
// `(+ x (* 2 (unit 38 kN)))`. Tests compare trees by this text.
func (f *Formula) String() string {
	if f.Root < 0 {
		return "<none>"
	}
	var b strings.Builder
	f.print(&b, f.Root)
	return b.String()
}

func (f *Formula) print(b *strings.Builder, n int32) {
	nd := &f.Nodes[n]
	switch nd.Kind {
	case KNumber, KBool, KString, KName:
		b.WriteString(f.Text(n))
	case KQuantity:
		q := f.Quantity(n)
		b.WriteString("(unit " + f.QuantityNumber(q) + " " + f.QuantityUnit(q) + ")")
	case KUnary:
		b.WriteString("(" + nd.Op.String() + " ")
		f.print(b, nd.A)
		b.WriteString(")")
	case KBinary:
		b.WriteString("(" + nd.Op.String() + " ")
		f.print(b, nd.A)
		b.WriteString(" ")
		f.print(b, nd.B)
		b.WriteString(")")
	case KRange:
		b.WriteString("(range " + nd.Op.String() + " " + nd.Op2.String() + " ")
		f.printTerms(b, n)
	case KCond:
		b.WriteString("(? ")
		f.printTerms(b, n)
	case KField:
		b.WriteString("(. ")
		f.print(b, nd.A)
		b.WriteString(" " + f.Text(nd.B) + ")")
	case KIndex:
		b.WriteString("(index ")
		f.print(b, nd.A)
		b.WriteString(" ")
		f.print(b, nd.B)
		b.WriteString(")")
	case KCall:
		b.WriteString("(call " + f.Callee(n))
		for _, a := range f.ArgList(n) {
			b.WriteString(" ")
			f.print(b, a)
		}
		b.WriteString(")")
	case KList:
		b.WriteString("(list")
		for _, a := range f.ArgList(n) {
			b.WriteString(" ")
			f.print(b, a)
		}
		b.WriteString(")")
	case KRecord:
		b.WriteString("(record")
		for _, a := range f.ArgList(n) {
			b.WriteString(" ")
			f.print(b, a)
		}
		b.WriteString(")")
	}
}

// printTerms prints the three operands of a KCond or a KRange and the
// closing bracket.
func (f *Formula) printTerms(b *strings.Builder, n int32) {
	x, y, z := f.Terms(n)
	f.print(b, x)
	b.WriteString(" ")
	f.print(b, y)
	b.WriteString(" ")
	f.print(b, z)
	b.WriteString(")")
}
