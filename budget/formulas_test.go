package budget

import (
	"go/ast"
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The "Formulas" table in each package's documentation names, for every
// figure the package computes, the function that computes it and the test
// that checks it. This test keeps those tables true: each function exists in
// the package, production code calls it, and the named test exists and
// calls it.
func TestFormulaIndex(t *testing.T) {
	docs := map[string]string{ // package directory → file holding its doc
		".":         "doc.go",
		"units":     "doc.go",
		"numeric":   "doc.go",
		"optics":    "doc.go",
		"drive":     "doc.go",
		"setup":     "doc.go",
		"atoms":     "transitions.go",
		"../limits": "doc.go",
		"../safety": "doc.go",
	}
	used := productionReferences(t, "..")
	for dir, doc := range docs {
		t.Run(dir, func(t *testing.T) {
			rows := formulaRows(t, filepath.Join(dir, doc))
			if len(rows) == 0 {
				t.Fatalf("%s: no Formulas table in %s", dir, doc)
			}
			decls, tests := packageFuncs(t, dir)
			for _, r := range rows {
				fn, test := r[0], r[1]
				name := fn[strings.LastIndex(fn, ".")+1:]
				if !decls[fn] {
					t.Errorf("%s: function %s is not declared in the package", dir, fn)
				}
				if used[name] == 0 {
					t.Errorf("%s: %s is not called by production code", dir, fn)
				}
				calls, ok := tests[test]
				switch {
				case !ok:
					t.Errorf("%s: test %s (for %s) does not exist", dir, test, fn)
				case !calls[name]:
					t.Errorf("%s: test %s does not call %s", dir, test, fn)
				}
			}
		})
	}
}

// formulaRows reads the function and test columns of the table under
// "# Formulas" in a doc comment.
func formulaRows(t *testing.T, file string) [][2]string {
	t.Helper()
	src, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	var rows [][2]string
	in := false
	for _, line := range strings.Split(string(src), "\n") {
		if strings.HasPrefix(line, "// # Formulas") {
			in = true
			continue
		}
		if !in || !strings.HasPrefix(line, "//\t|") {
			continue
		}
		cells := strings.Split(strings.Trim(strings.TrimPrefix(line, "//\t"), "|"), "|")
		if len(cells) != 5 {
			t.Fatalf("%s: a Formulas row needs 5 cells: %q", file, line)
		}
		fn, test := strings.TrimSpace(cells[3]), strings.TrimSpace(cells[4])
		if fn == "function" || strings.HasPrefix(fn, "---") {
			continue
		}
		rows = append(rows, [2]string{fn, test})
	}
	return rows
}

// packageFuncs lists the functions declared in a package's production files
// (methods as Type.Method) and, for each test or example, the names it
// calls.
func packageFuncs(t *testing.T, dir string) (map[string]bool, map[string]map[string]bool) {
	t.Helper()
	decls, tests := map[string]bool{}, map[string]map[string]bool{}
	files, _ := filepath.Glob(filepath.Join(dir, "*.go"))
	fset := token.NewFileSet()
	for _, f := range files {
		af, err := parser.ParseFile(fset, f, nil, 0)
		if err != nil {
			t.Fatal(err)
		}
		for _, d := range af.Decls {
			fd, ok := d.(*ast.FuncDecl)
			if !ok {
				continue
			}
			if strings.HasSuffix(f, "_test.go") {
				calls := map[string]bool{}
				ast.Inspect(fd, func(n ast.Node) bool {
					switch x := n.(type) {
					case *ast.Ident:
						calls[x.Name] = true
					case *ast.SelectorExpr:
						calls[x.Sel.Name] = true
					}
					return true
				})
				tests[fd.Name.Name] = calls
				continue
			}
			name := fd.Name.Name
			if fd.Recv != nil && len(fd.Recv.List) == 1 {
				typ := fd.Recv.List[0].Type
				if st, ok := typ.(*ast.StarExpr); ok {
					typ = st.X
				}
				if id, ok := typ.(*ast.Ident); ok {
					name = id.Name + "." + name
				}
			}
			decls[name] = true
		}
	}
	return decls, tests
}

// productionReferences counts, over every production file of the module,
// the uses of each name other than its own declaration.
func productionReferences(t *testing.T, root string) map[string]int {
	t.Helper()
	refs := map[string]int{}
	fset := token.NewFileSet()
	err := filepath.WalkDir(root, func(path string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && (strings.HasPrefix(d.Name(), ".") && path != root || d.Name() == "testdata") {
			return filepath.SkipDir
		}
		if d.IsDir() || !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
			return nil
		}
		af, err := parser.ParseFile(fset, path, nil, 0)
		if err != nil {
			return err
		}
		declared := map[*ast.Ident]bool{}
		for _, d := range af.Decls {
			if fd, ok := d.(*ast.FuncDecl); ok {
				declared[fd.Name] = true
			}
		}
		ast.Inspect(af, func(n ast.Node) bool {
			switch x := n.(type) {
			case *ast.SelectorExpr:
				refs[x.Sel.Name]++
				ast.Inspect(x.X, func(m ast.Node) bool {
					if id, ok := m.(*ast.Ident); ok {
						refs[id.Name]++
					}
					return true
				})
				return false
			case *ast.Ident:
				if !declared[x] {
					refs[x.Name]++
				}
			}
			return true
		})
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return refs
}

// The losses that leave a path as a beam: mirror leakage, an AOM's other
// orders and a combiner's rejected light (common practice: each leaves as a
// collimated beam that can reach an eye); absorbed, coupled, dumped and
// scattered power does not.
func TestEscapingLoss(t *testing.T) {
	for _, k := range []string{LossMirror, LossDiffraction, LossCombiner} {
		if !EscapingLoss(k) {
			t.Errorf("%s does not leave the path", k)
		}
	}
	for _, k := range []string{LossClipping, LossAbsorption, LossFilter, LossSplitterPort, LossCoupling, LossDump, LossScattered} {
		if EscapingLoss(k) {
			t.Errorf("%s leaves the path as a beam", k)
		}
	}
}
