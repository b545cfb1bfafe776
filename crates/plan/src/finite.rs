//! Finds the first number in a serialisable value that is NaN or infinite, with the path to it:
//! the check that no figure of an evaluation can reach a screen or a sheet as "NaN".
//! (JSON would hide a NaN as `null`, the same as an empty option; this looks at the numbers
//! themselves.)

use serde::Serialize;
use serde::ser;

/// The path of the first non-finite number in `value` ("parts[0].cases[1].reading.output_v"),
/// or `None` when every number is finite.
pub fn first_non_finite<T: Serialize + ?Sized>(value: &T) -> Option<String> {
    let mut walker = Walker {
        path: Vec::new(),
        found: None,
    };
    let _ = value.serialize(&mut walker);
    walker.found
}

struct Walker {
    path: Vec<String>,
    found: Option<String>,
}

/// Never raised: the walk stops by recording what it found.
#[derive(Debug)]
struct Stop;

impl std::fmt::Display for Stop {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("stop")
    }
}

impl std::error::Error for Stop {}

impl ser::Error for Stop {
    fn custom<T: std::fmt::Display>(_: T) -> Self {
        Stop
    }
}

impl Walker {
    fn number(&mut self, v: f64) -> Result<(), Stop> {
        if !v.is_finite() && self.found.is_none() {
            let names: Vec<&str> = self
                .path
                .iter()
                .map(String::as_str)
                .filter(|p| !p.is_empty())
                .collect();
            self.found = Some(names.join("."));
        }
        Ok(())
    }

    fn nested<T: Serialize + ?Sized>(&mut self, name: String, v: &T) -> Result<(), Stop> {
        if self.found.is_some() {
            return Ok(());
        }
        self.path.push(name);
        let r = v.serialize(&mut *self);
        self.path.pop();
        r
    }
}

macro_rules! ignore {
    ($($f:ident: $t:ty),*) => {
        $(fn $f(self, _: $t) -> Result<(), Stop> { Ok(()) })*
    };
}

impl ser::Serializer for &mut Walker {
    type Ok = ();
    type Error = Stop;
    type SerializeSeq = Self;
    type SerializeTuple = Self;
    type SerializeTupleStruct = Self;
    type SerializeTupleVariant = Self;
    type SerializeMap = Self;
    type SerializeStruct = Self;
    type SerializeStructVariant = Self;

    ignore!(serialize_bool: bool, serialize_i8: i8, serialize_i16: i16, serialize_i32: i32,
        serialize_i64: i64, serialize_u8: u8, serialize_u16: u16, serialize_u32: u32,
        serialize_u64: u64, serialize_char: char, serialize_str: &str, serialize_bytes: &[u8],
        serialize_unit_struct: &'static str);

    fn serialize_f32(self, v: f32) -> Result<(), Stop> {
        self.number(f64::from(v))
    }
    fn serialize_f64(self, v: f64) -> Result<(), Stop> {
        self.number(v)
    }
    fn serialize_none(self) -> Result<(), Stop> {
        Ok(())
    }
    fn serialize_some<T: Serialize + ?Sized>(self, v: &T) -> Result<(), Stop> {
        v.serialize(self)
    }
    fn serialize_unit(self) -> Result<(), Stop> {
        Ok(())
    }
    fn serialize_unit_variant(self, _: &'static str, _: u32, _: &'static str) -> Result<(), Stop> {
        Ok(())
    }
    fn serialize_newtype_struct<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        v: &T,
    ) -> Result<(), Stop> {
        v.serialize(self)
    }
    fn serialize_newtype_variant<T: Serialize + ?Sized>(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
        v: &T,
    ) -> Result<(), Stop> {
        self.nested(variant.to_owned(), v)
    }
    fn serialize_seq(self, _: Option<usize>) -> Result<Self, Stop> {
        self.path.push("[]".to_owned());
        Ok(self)
    }
    fn serialize_tuple(self, len: usize) -> Result<Self, Stop> {
        self.serialize_seq(Some(len))
    }
    fn serialize_tuple_struct(self, _: &'static str, len: usize) -> Result<Self, Stop> {
        self.serialize_seq(Some(len))
    }
    fn serialize_tuple_variant(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
        _: usize,
    ) -> Result<Self, Stop> {
        self.path.push(variant.to_owned());
        Ok(self)
    }
    fn serialize_map(self, _: Option<usize>) -> Result<Self, Stop> {
        self.path.push("{}".to_owned());
        Ok(self)
    }
    fn serialize_struct(self, _: &'static str, _: usize) -> Result<Self, Stop> {
        self.path.push(String::new());
        Ok(self)
    }
    fn serialize_struct_variant(
        self,
        _: &'static str,
        _: u32,
        variant: &'static str,
        _: usize,
    ) -> Result<Self, Stop> {
        self.path.push(variant.to_owned());
        Ok(self)
    }
}

/// Every compound closes by dropping the path element it opened.
macro_rules! compound {
    ($tr:ident, $f:ident $(, $key:ident)?) => {
        impl ser::$tr for &mut Walker {
            type Ok = ();
            type Error = Stop;
            fn $f<T: Serialize + ?Sized>(&mut self, $($key: &'static str,)? v: &T) -> Result<(), Stop> {
                let name = compound!(@name $($key)?);
                self.nested(name, v)
            }
            fn end(self) -> Result<(), Stop> {
                self.path.pop();
                Ok(())
            }
        }
    };
    (@name $key:ident) => { $key.to_owned() };
    (@name) => { "[]".to_owned() };
}

compound!(SerializeSeq, serialize_element);
compound!(SerializeTuple, serialize_element);
compound!(SerializeTupleStruct, serialize_field);
compound!(SerializeTupleVariant, serialize_field);
compound!(SerializeStruct, serialize_field, key);
compound!(SerializeStructVariant, serialize_field, key);

impl ser::SerializeMap for &mut Walker {
    type Ok = ();
    type Error = Stop;
    fn serialize_key<T: Serialize + ?Sized>(&mut self, _: &T) -> Result<(), Stop> {
        Ok(())
    }
    fn serialize_value<T: Serialize + ?Sized>(&mut self, v: &T) -> Result<(), Stop> {
        self.nested("value".to_owned(), v)
    }
    fn end(self) -> Result<(), Stop> {
        self.path.pop();
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::first_non_finite;
    use serde::Serialize;

    #[derive(Serialize)]
    struct Inner {
        a: f64,
        b: Option<f64>,
    }

    #[derive(Serialize)]
    struct Outer {
        name: String,
        items: Vec<Inner>,
    }

    #[test]
    fn finds_the_path_of_a_nan_and_passes_empty_options() {
        let ok = Outer {
            name: "NaN in a name is text, not a number".into(),
            items: vec![Inner { a: 1.0, b: None }],
        };
        assert_eq!(first_non_finite(&ok), None);
        let bad = Outer {
            name: String::new(),
            items: vec![
                Inner { a: 1.0, b: None },
                Inner {
                    a: 2.0,
                    b: Some(f64::INFINITY),
                },
            ],
        };
        let path = first_non_finite(&bad).expect("found");
        assert!(path.contains("items") && path.ends_with('b'), "{path}");
    }
}
