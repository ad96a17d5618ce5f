//! Reading JSON from outside: duplicate keys are errors (no silent "last one wins"), and parse
//! errors are said in our own words, located by column (and line, for a file).

use serde::de::{self, Deserialize, Deserializer, MapAccess, SeqAccess, Visitor};
use serde_json::{Map, Value};

/// Parses `text` as one JSON value. `multi_line` says whether to locate errors by line and
/// column (a file) or by column alone (one line of a stream).
pub fn parse(text: &str, multi_line: bool) -> Result<Value, String> {
    serde_json::from_str::<Strict>(text)
        .map(|Strict(v)| v)
        .map_err(|e| describe(&e, text, multi_line))
}

/// A JSON value whose objects never repeat a key.
struct Strict(Value);

impl<'de> Deserialize<'de> for Strict {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Strict, D::Error> {
        d.deserialize_any(StrictVisitor)
    }
}

struct StrictVisitor;

/// Marks our own messages inside the parser's error, to tell them from its wording.
const OURS: &str = "armforge: ";

impl<'de> Visitor<'de> for StrictVisitor {
    type Value = Strict;

    fn expecting(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("a JSON value")
    }
    fn visit_bool<E>(self, v: bool) -> Result<Strict, E> {
        Ok(Strict(Value::Bool(v)))
    }
    fn visit_i64<E>(self, v: i64) -> Result<Strict, E> {
        Ok(Strict(Value::from(v)))
    }
    fn visit_u64<E>(self, v: u64) -> Result<Strict, E> {
        Ok(Strict(Value::from(v)))
    }
    fn visit_f64<E>(self, v: f64) -> Result<Strict, E> {
        Ok(Strict(Value::from(v)))
    }
    fn visit_str<E>(self, v: &str) -> Result<Strict, E> {
        Ok(Strict(Value::from(v)))
    }
    fn visit_unit<E>(self) -> Result<Strict, E> {
        Ok(Strict(Value::Null))
    }
    fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<Strict, A::Error> {
        let mut items = Vec::new();
        while let Some(Strict(item)) = seq.next_element()? {
            items.push(item);
        }
        Ok(Strict(Value::Array(items)))
    }
    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<Strict, A::Error> {
        let mut object = Map::new();
        while let Some(key) = map.next_key::<String>()? {
            if object.contains_key(&key) {
                return Err(de::Error::custom(format!(
                    "{OURS}the key {} appears twice in one object",
                    Value::from(key)
                )));
            }
            let Strict(value) = map.next_value()?;
            object.insert(key, value);
        }
        Ok(Strict(Value::Object(object)))
    }
}

/// The parse error in our words: where, and what was found there.
fn describe(e: &serde_json::Error, text: &str, multi_line: bool) -> String {
    let place = if multi_line {
        format!("line {}, column {}", e.line(), e.column())
    } else {
        format!("column {}", e.column())
    };
    let wording = e.to_string();
    if let Some(ours) = wording.strip_prefix(OURS) {
        let ours = ours.rsplit_once(" at line ").map_or(ours, |(m, _)| m);
        return format!("{ours} (at {place})");
    }
    if e.is_eof() {
        return format!(
            "the JSON ends early (at {place}): a bracket, brace or string is not closed"
        );
    }
    if wording.starts_with("number out of range") {
        return format!("a number at {place} is too large for a 64-bit float");
    }
    let found = text
        .lines()
        .nth(e.line().saturating_sub(1))
        .and_then(|line| line.chars().nth(e.column().saturating_sub(1)));
    match found {
        Some(c) => format!(
            "not valid JSON at {place}: unexpected {}",
            Value::from(c.to_string())
        ),
        None => format!("not valid JSON at {place}"),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn duplicate_keys_are_errors_at_any_depth() {
        let e = parse(r#"{"joints": [1], "joints": [2]}"#, false).unwrap_err();
        assert_eq!(
            e,
            r#"the key "joints" appears twice in one object (at column 24)"#
        );
        assert!(parse(r#"[{"a": 1, "a": 1}]"#, false).is_err());
        assert!(parse(r#"{"a": {"b": 1}, "b": {"a": 2}}"#, false).is_ok());
    }

    #[test]
    fn errors_are_in_our_words() {
        let e = parse("{x", false).unwrap_err();
        assert_eq!(e, r#"not valid JSON at column 2: unexpected "x""#);
        assert!(!e.contains("ident"), "{e}");
        let e = parse("[1, 2", false).unwrap_err();
        assert!(e.starts_with("the JSON ends early"), "{e}");
        let e = parse("[1e400]", false).unwrap_err();
        assert!(e.contains("too large for a 64-bit float"), "{e}");
        let e = parse("{\n \"a\": x}", true).unwrap_err();
        assert_eq!(e, r#"not valid JSON at line 2, column 7: unexpected "x""#);
    }
}
