//! Typed reading of TOML values with their spans: each reader reports what is wrong (with
//! the key, the place and the numbers in the file's units) and returns `None` for a value it
//! could not accept, so that reading goes on and every problem of the file is found.

use std::ops::Range;

use toml_edit::{Item, TableLike, Value};

use super::plausible;
use super::source::Source;
use crate::text::shorten;
use crate::units::tidy;
use crate::units::{AngleUnit, LengthUnit};

/// A value with the byte range it came from.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Spanned<T> {
    /// The value, in the file's units.
    pub value: T,
    /// Where it was written.
    pub span: Range<usize>,
}

/// What a number in the file measures, for messages in the file's units.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Quantity {
    /// A length in the file's length unit.
    Length(LengthUnit),
    /// An angle in the file's angle unit.
    Angle(AngleUnit),
    /// A pure number (axis components, rotation-matrix entries).
    Plain,
}

impl Quantity {
    /// What a value of this quantity is, e.g. `a length in mm`.
    pub(crate) fn describe(self) -> String {
        match self {
            Quantity::Length(unit) => format!("a length in {}", unit.symbol()),
            Quantity::Angle(AngleUnit::Degree) => "an angle in degrees".to_string(),
            Quantity::Angle(AngleUnit::Radian) => "an angle in radians".to_string(),
            Quantity::Plain => "a number".to_string(),
        }
    }

    /// A number of this quantity for messages, e.g. `12.5 mm` or `90°`.
    pub(crate) fn show(self, x: f64) -> String {
        match self {
            Quantity::Length(unit) => format!("{} {}", tidy(x), unit.symbol()),
            Quantity::Angle(unit) => format!("{}{}", tidy(x), unit.display_symbol()),
            Quantity::Plain => tidy(x),
        }
    }
}

/// One key of a table with its spans.
pub(crate) struct Entry<'d> {
    /// The key as written.
    pub key: String,
    /// Where the key was written.
    pub key_span: Range<usize>,
    /// The value.
    pub item: &'d Item,
}

impl Entry<'_> {
    /// Where the value was written (the key's place when the value has none).
    pub(crate) fn span(&self) -> Range<usize> {
        self.item.span().unwrap_or_else(|| self.key_span.clone())
    }
}

/// The keys of a table, in file order, with their spans (`fallback` for keys without one).
pub(crate) fn entries<'d>(table: &'d dyn TableLike, fallback: &Range<usize>) -> Vec<Entry<'d>> {
    table
        .iter()
        .map(|(key, item)| {
            let key_span = table
                .get_key_value(key)
                .and_then(|(k, _)| k.span())
                .or_else(|| item.span())
                .unwrap_or_else(|| fallback.clone());
            Entry {
                key: key.to_string(),
                key_span,
                item,
            }
        })
        .collect()
}

/// A short description of what was found, for "expected …, found …" messages.
pub(crate) fn found(item: &Item) -> String {
    match item {
        Item::Value(Value::String(s)) => format!("the string \"{}\"", shown(s.value())),
        Item::Value(Value::Boolean(b)) => format!("the boolean {}", b.value()),
        Item::Value(Value::Integer(i)) => format!("the integer {}", i.value()),
        Item::Value(Value::Float(f)) => format!("the number {}", tidy(*f.value())),
        Item::Value(Value::Datetime(_)) => "a date-time".to_string(),
        Item::Value(Value::Array(a)) => format!("an array of {} values", a.len()),
        Item::Value(Value::InlineTable(_)) | Item::Table(_) => "a table".to_string(),
        Item::ArrayOfTables(_) => "an array of tables".to_string(),
        Item::None => "nothing".to_string(),
    }
}

/// The most characters of a value from the file that a message repeats.
pub(crate) const SHOWN_CHARS: usize = 60;

/// A value from the file as a message repeats it: at most [`SHOWN_CHARS`] characters.
pub(crate) fn shown(text: &str) -> std::borrow::Cow<'_, str> {
    shorten(text, SHOWN_CHARS)
}

/// Reads a string.
pub(crate) fn string(source: &mut Source, entry: &Entry, path: &str) -> Option<Spanned<String>> {
    match entry.item.as_str() {
        Some(s) => Some(Spanned {
            value: s.to_string(),
            span: entry.span(),
        }),
        None => {
            let message = format!("expected a string, found {}", found(entry.item));
            source.report(&entry.span(), path, message);
            None
        }
    }
}

/// Reads one finite number (a TOML integer or float).
pub(crate) fn number(
    source: &mut Source,
    entry: &Entry,
    path: &str,
    quantity: Quantity,
) -> Option<Spanned<f64>> {
    match entry.item.as_value() {
        Some(value) => number_value(source, value, &entry.span(), path, quantity),
        None => {
            let message = format!(
                "expected {}, found {}",
                quantity.describe(),
                found(entry.item)
            );
            source.report(&entry.span(), path, message);
            None
        }
    }
}

fn number_value(
    source: &mut Source,
    value: &Value,
    fallback: &Range<usize>,
    path: &str,
    quantity: Quantity,
) -> Option<Spanned<f64>> {
    let span = value.span().unwrap_or_else(|| fallback.clone());
    let x = match value {
        Value::Integer(i) => *i.value() as f64,
        Value::Float(f) => *f.value(),
        other => {
            let message = format!(
                "expected {}, found {}",
                quantity.describe(),
                found(&Item::Value(other.clone()))
            );
            source.report(&span, path, message);
            return None;
        }
    };
    if !x.is_finite() {
        let message = format!(
            "{x} is not a finite number; expected {}",
            quantity.describe()
        );
        source.report(&span, path, message);
        return None;
    }
    let implausible = match quantity {
        Quantity::Length(unit) => plausible::length_problem(unit, x),
        Quantity::Angle(unit) => plausible::angle_problem(unit, x),
        Quantity::Plain => None,
    };
    if let Some(message) = implausible {
        source.report(&span, path, message);
        return None;
    }
    Some(Spanned { value: x, span })
}

/// Reads an array of exactly `N` finite numbers, reporting every bad element.
pub(crate) fn numbers<const N: usize>(
    source: &mut Source,
    entry: &Entry,
    path: &str,
    quantity: Quantity,
    what: &str,
) -> Option<Spanned<[f64; N]>> {
    let span = entry.span();
    let values = array(source, entry.item, &span, path, N, what)?;
    numbers_of(source, &values, &span, path, quantity)
}

fn numbers_of<const N: usize>(
    source: &mut Source,
    values: &[&Value],
    span: &Range<usize>,
    path: &str,
    quantity: Quantity,
) -> Option<Spanned<[f64; N]>> {
    let mut out = [0.0; N];
    let mut all_good = true;
    for (slot, value) in out.iter_mut().zip(values) {
        match number_value(source, value, span, path, quantity) {
            Some(x) => *slot = x.value,
            None => all_good = false,
        }
    }
    all_good.then(|| Spanned {
        value: out,
        span: span.clone(),
    })
}

/// The elements of an array of exactly `len` values, or a report of what was found.
fn array<'d>(
    source: &mut Source,
    item: &'d Item,
    span: &Range<usize>,
    path: &str,
    len: usize,
    what: &str,
) -> Option<Vec<&'d Value>> {
    match item.as_array() {
        Some(a) if a.len() == len => Some(a.iter().collect()),
        Some(a) => {
            let message = format!("expected {what}, found {} values", a.len());
            source.report(span, path, message);
            None
        }
        None => {
            let message = format!("expected {what}, found {}", found(item));
            source.report(span, path, message);
            None
        }
    }
}

/// Reads a 3×3 matrix written as three rows of three numbers.
pub(crate) fn matrix3(
    source: &mut Source,
    entry: &Entry,
    path: &str,
) -> Option<Spanned<[[f64; 3]; 3]>> {
    const WHAT: &str = "three rows [[r11, r12, r13], [r21, r22, r23], [r31, r32, r33]]";
    let span = entry.span();
    let rows = array(source, entry.item, &span, path, 3, WHAT)?;
    let mut out = [[0.0; 3]; 3];
    let mut all_good = true;
    for (slot, row) in out.iter_mut().zip(rows) {
        let row_span = row.span().unwrap_or_else(|| span.clone());
        let read = match row.as_array() {
            Some(a) if a.len() == 3 => {
                let values: Vec<&Value> = a.iter().collect();
                numbers_of::<3>(source, &values, &row_span, path, Quantity::Plain)
            }
            _ => {
                let message = format!(
                    "each row must be an array of three numbers, found {}",
                    found(&Item::Value(row.clone()))
                );
                source.report(&row_span, path, message);
                None
            }
        };
        match read {
            Some(r) => *slot = r.value,
            None => all_good = false,
        }
    }
    all_good.then_some(Spanned { value: out, span })
}

/// Reports a key that the format does not know, naming the keys it does.
pub(crate) fn report_unknown(source: &mut Source, entry: &Entry, path: &str, known: &[&str]) {
    let list = known
        .iter()
        .map(|k| format!("`{k}`"))
        .collect::<Vec<_>>()
        .join(", ");
    let message = format!(
        "unknown key `{}`; the keys here are {list}",
        shown(&entry.key)
    );
    source.report(&entry.key_span, path, message);
}

/// Reports a value that is not one of the allowed words.
pub(crate) fn report_not_one_of(
    source: &mut Source,
    value: &Spanned<String>,
    path: &str,
    what: &str,
    allowed: &[&str],
) {
    let list = allowed
        .iter()
        .map(|k| format!("\"{k}\""))
        .collect::<Vec<_>>()
        .join(", ");
    let message = format!(
        "unknown {what} \"{}\"; expected one of {list}",
        shown(&value.value)
    );
    source.report(&value.span, path, message);
}
