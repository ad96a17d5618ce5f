//! Where a file nests deepest: the place to show when the TOML parser stops at its nesting
//! limit without saying where (a dotted header such as `[a.b.c.…]` 200 keys deep).

/// Depth from which nesting counts as the likely cause of a parse error without a place; a
/// description nests at most 4 deep (`rotation = [[…]]` inside `[tool]`).
const SUSPICIOUS_DEPTH: usize = 16;

/// The byte offset where tables, arrays, inline tables and dotted keys nest deepest, with the
/// depth there, when it is at least [`SUSPICIOUS_DEPTH`]. Strings and comments are skipped.
pub(crate) fn deepest(text: &str) -> Option<(usize, usize)> {
    let mut scan = Scan::default();
    let mut chars = text.char_indices().peekable();
    while let Some((at, c)) = chars.next() {
        match scan.quote {
            Some(q) => {
                if c == '\\' && q == '"' {
                    chars.next();
                } else if c == q {
                    scan.quote = None;
                } else if c == '\n' {
                    scan.new_line();
                }
                continue;
            }
            None if scan.comment => {
                if c == '\n' {
                    scan.comment = false;
                    scan.new_line();
                }
                continue;
            }
            None => {}
        }
        match c {
            '#' => scan.comment = true,
            '"' | '\'' => scan.quote = Some(c),
            '\n' => scan.new_line(),
            '[' | '{' => {
                scan.brackets += 1;
                scan.in_key = true;
            }
            ']' | '}' => {
                scan.brackets = scan.brackets.saturating_sub(1);
                scan.dots = 0;
            }
            '=' => {
                scan.in_key = false;
                scan.dots = 0;
            }
            ',' => {
                scan.in_key = scan.brackets > 0;
                scan.dots = 0;
            }
            '.' if scan.in_key => scan.dots += 1,
            _ => {}
        }
        let depth = scan.brackets + scan.dots;
        if depth > scan.deepest.map_or(0, |(_, d)| d) {
            scan.deepest = Some((at, depth));
        }
    }
    scan.deepest.filter(|&(_, d)| d >= SUSPICIOUS_DEPTH)
}

/// The scanner's state.
#[derive(Default)]
struct Scan {
    quote: Option<char>,
    comment: bool,
    in_key: bool,
    brackets: usize,
    dots: usize,
    deepest: Option<(usize, usize)>,
}

impl Scan {
    fn new_line(&mut self) {
        // A table header or a key starts every line outside a multi-line value.
        self.dots = 0;
        if self.brackets == 0 {
            self.in_key = true;
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_a_deep_dotted_header_and_ignores_strings_and_numbers() {
        let header = vec!["a"; 200].join(".");
        let text = format!("name = \"x.y.z\" # a.b.c\nd = 1.5\n\n[{header}]\nk = 1\n");
        let (at, depth) = deepest(&text).expect("deep");
        assert_eq!(depth, 200);
        let line_start = text.find('[').unwrap();
        // The deepest point is the last dot of the header.
        assert_eq!(at, line_start + 1 + header.rfind('.').unwrap());
        assert_eq!(
            deepest("name = \"a.b.c.d.e.f.g.h.i.j.k.l.m.n.o.p.q.r\"\n"),
            None
        );
        assert_eq!(deepest("[[joint]]\nlimits = [1.5, 2.5]\n"), None);
    }
}
