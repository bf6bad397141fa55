//! A small JSON value that keeps its keys in the order they were written
//! and refuses a number that is not finite.

use serde::ser::{SerializeMap, SerializeSeq};
use serde::{Serialize, Serializer};

/// A JSON value.
#[derive(Clone, Debug, PartialEq)]
pub enum J {
    Null,
    Bool(bool),
    Num(f64),
    Int(u64),
    Str(String),
    Arr(Vec<J>),
    Obj(Obj),
}

/// A JSON object, keys in insertion order.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct Obj(pub Vec<(String, J)>);

impl Obj {
    pub fn new() -> Obj {
        Obj(Vec::new())
    }

    /// Add a key (builder style).
    pub fn with(mut self, key: impl Into<String>, value: impl Into<J>) -> Obj {
        self.0.push((key.into(), value.into()));
        self
    }

    pub fn set(&mut self, key: impl Into<String>, value: impl Into<J>) {
        self.0.push((key.into(), value.into()));
    }

    /// Every key path whose number is not finite (`air_handlers[0].coil.shr`).
    pub fn non_finite(&self) -> Vec<String> {
        let mut out = Vec::new();
        walk(&J::Obj(self.clone()), String::new(), &mut out);
        out
    }
}

fn walk(v: &J, path: String, out: &mut Vec<String>) {
    match v {
        J::Num(x) if !x.is_finite() => out.push(path),
        J::Arr(items) => {
            for (i, x) in items.iter().enumerate() {
                walk(x, format!("{path}[{i}]"), out);
            }
        }
        J::Obj(o) => {
            for (k, x) in &o.0 {
                let p = if path.is_empty() {
                    k.clone()
                } else {
                    format!("{path}.{k}")
                };
                walk(x, p, out);
            }
        }
        _ => {}
    }
}

impl From<f64> for J {
    fn from(v: f64) -> J {
        J::Num(v)
    }
}
impl From<u32> for J {
    fn from(v: u32) -> J {
        J::Int(u64::from(v))
    }
}
impl From<bool> for J {
    fn from(v: bool) -> J {
        J::Bool(v)
    }
}
impl From<&str> for J {
    fn from(v: &str) -> J {
        J::Str(v.to_string())
    }
}
impl From<String> for J {
    fn from(v: String) -> J {
        J::Str(v)
    }
}
impl From<Obj> for J {
    fn from(v: Obj) -> J {
        J::Obj(v)
    }
}
impl From<Vec<J>> for J {
    fn from(v: Vec<J>) -> J {
        J::Arr(v)
    }
}
impl<T: Into<J>> From<Option<T>> for J {
    fn from(v: Option<T>) -> J {
        v.map_or(J::Null, Into::into)
    }
}

impl Serialize for J {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        match self {
            J::Null => s.serialize_unit(),
            J::Bool(b) => s.serialize_bool(*b),
            J::Num(x) => {
                if x.is_finite() {
                    s.serialize_f64(*x)
                } else {
                    Err(serde::ser::Error::custom("a number that is not finite"))
                }
            }
            J::Int(i) => s.serialize_u64(*i),
            J::Str(t) => s.serialize_str(t),
            J::Arr(items) => {
                let mut seq = s.serialize_seq(Some(items.len()))?;
                for x in items {
                    seq.serialize_element(x)?;
                }
                seq.end()
            }
            J::Obj(o) => o.serialize(s),
        }
    }
}

impl Serialize for Obj {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let mut map = s.serialize_map(Some(self.0.len()))?;
        for (k, v) in &self.0 {
            map.serialize_entry(k, v)?;
        }
        map.end()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn keys_keep_their_order_and_nan_is_refused() {
        let o = Obj::new()
            .with("b", 1.5)
            .with("a", J::Null)
            .with("c", vec![J::from(true)]);
        assert_eq!(
            serde_json::to_string(&o).ok().as_deref(),
            Some(r#"{"b":1.5,"a":null,"c":[true]}"#)
        );
        let bad = Obj::new().with("x", Obj::new().with("y", vec![J::from(f64::NAN)]));
        assert_eq!(bad.non_finite(), vec!["x.y[0]".to_string()]);
        assert!(serde_json::to_string(&bad).is_err());
        let inf = Obj::new().with("z", f64::INFINITY);
        assert!(serde_json::to_string(&inf).is_err());
    }
}
