//! Points and vectors of the plane, m (positions) and any unit (vectors: displacements,
//! forces). A point minus a point is a vector; a point plus a vector is a point; two
//! points never add (kurbo's distinction), so a position cannot be mistaken for a force.

use serde::{Deserialize, Serialize};
use std::ops::{Add, Mul, Neg, Sub};

/// A position (x, y) in m; x to the right, y up.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct Point {
    /// Horizontal position, m.
    pub x: f64,
    /// Vertical position, m.
    pub y: f64,
}

/// A vector (x, y): a displacement (m) or a force (kN), by context.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
pub struct Vector {
    /// Horizontal component, positive to the right.
    pub x: f64,
    /// Vertical component, positive up.
    pub y: f64,
}

impl Point {
    /// The point (x, y).
    pub const fn new(x: f64, y: f64) -> Point {
        Point { x, y }
    }
    /// Distance to `other`, m.
    pub fn distance(self, other: Point) -> f64 {
        (other - self).length()
    }
    /// The point a fraction `t` of the way from `self` to `other` (t = 0 gives `self`).
    pub fn lerp(self, other: Point, t: f64) -> Point {
        self + (other - self) * t
    }
    /// True when both coordinates are finite.
    pub fn is_finite(self) -> bool {
        self.x.is_finite() && self.y.is_finite()
    }
    /// As a tuple (x, y).
    pub fn to_tuple(self) -> (f64, f64) {
        (self.x, self.y)
    }
}

impl Vector {
    /// The vector (x, y).
    pub const fn new(x: f64, y: f64) -> Vector {
        Vector { x, y }
    }
    /// Euclidean length.
    pub fn length(self) -> f64 {
        self.x.hypot(self.y)
    }
    /// Dot product.
    pub fn dot(self, other: Vector) -> f64 {
        self.x * other.x + self.y * other.y
    }
    /// The z component of the cross product (positive when `other` lies anticlockwise).
    pub fn cross(self, other: Vector) -> f64 {
        self.x * other.y - self.y * other.x
    }
}

impl From<(f64, f64)> for Point {
    fn from((x, y): (f64, f64)) -> Point {
        Point { x, y }
    }
}

impl Sub for Point {
    type Output = Vector;
    fn sub(self, o: Point) -> Vector {
        Vector { x: self.x - o.x, y: self.y - o.y }
    }
}

impl Add<Vector> for Point {
    type Output = Point;
    fn add(self, v: Vector) -> Point {
        Point { x: self.x + v.x, y: self.y + v.y }
    }
}

impl Sub<Vector> for Point {
    type Output = Point;
    fn sub(self, v: Vector) -> Point {
        Point { x: self.x - v.x, y: self.y - v.y }
    }
}

impl Add for Vector {
    type Output = Vector;
    fn add(self, o: Vector) -> Vector {
        Vector { x: self.x + o.x, y: self.y + o.y }
    }
}

impl Sub for Vector {
    type Output = Vector;
    fn sub(self, o: Vector) -> Vector {
        Vector { x: self.x - o.x, y: self.y - o.y }
    }
}

impl Mul<f64> for Vector {
    type Output = Vector;
    fn mul(self, k: f64) -> Vector {
        Vector { x: self.x * k, y: self.y * k }
    }
}

impl Neg for Vector {
    type Output = Vector;
    fn neg(self) -> Vector {
        Vector { x: -self.x, y: -self.y }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn points_and_vectors_combine_as_positions_and_displacements() {
        let (a, b) = (Point::new(1.0, 2.0), Point::new(4.0, 6.0));
        assert_eq!(b - a, Vector::new(3.0, 4.0));
        assert_eq!(a.distance(b), 5.0);
        assert_eq!(a + (b - a) * 0.5, Point::new(2.5, 4.0));
        assert_eq!(a.lerp(b, 1.0), b);
        assert_eq!(Vector::new(1.0, 0.0).cross(Vector::new(0.0, 1.0)), 1.0);
    }
}
