//! The app's state: one design signal (the last good design), the analysis derived from it,
//! and what the pointer is over. Plain data and small helpers, shared through context.

use crate::format::Units;
use leptos::prelude::*;
use springline_statics::{analyze, Analysis, Design};
use std::sync::Arc;

/// The analysis of the current design, or why there is none.
pub type Outcome = Result<Arc<Analysis>, String>;

/// The member of the truss idealisation under the pointer, in either canvas.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Hovered(pub Option<usize>);

/// Everything the components share.
#[derive(Clone, Copy)]
pub struct AppState {
    /// The last good design: only designs that analyse are ever stored here.
    pub design: RwSignal<Design>,
    /// Its analysis, memoised.
    pub analysis: Memo<Outcome>,
    /// The truss member under the pointer.
    pub hovered: RwSignal<Hovered>,
    /// Display units.
    pub units: RwSignal<Units>,
    /// Bumped when the window is resized, so canvases redraw.
    pub resized: RwSignal<u32>,
    /// Designs before the current one (undo), oldest first.
    pub past: RwSignal<Vec<Design>>,
    /// Designs undone (redo), most recent last.
    pub future: RwSignal<Vec<Design>>,
    /// A page-level message (a link that could not be opened, a refused drag).
    pub notice: RwSignal<Option<String>>,
    /// The load case shown in the drawings (index into `Analysis::load_cases`).
    pub case: RwSignal<usize>,
    /// The analysis just computed for a design about to be set, so the memo does not
    /// compute it a second time.
    checked: StoredValue<Option<(Design, Arc<Analysis>)>>,
}

/// How many steps undo keeps.
pub const HISTORY_LIMIT: usize = 200;

impl AppState {
    /// State holding `design`.
    pub fn new(design: Design) -> Self {
        let design = RwSignal::new(design);
        let checked = StoredValue::new(None::<(Design, Arc<Analysis>)>);
        let analysis = Memo::new(move |_| {
            design.with(|d| {
                let cached =
                    checked.with_value(|c| c.as_ref().filter(|(cd, _)| cd == d).map(|(_, a)| a.clone()));
                match cached {
                    Some(a) => Ok(a),
                    None => analyze(d).map(Arc::new).map_err(|e| e.to_string()),
                }
            })
        });
        AppState {
            design,
            analysis,
            hovered: RwSignal::new(Hovered(None)),
            units: RwSignal::new(Units::Si),
            resized: RwSignal::new(0),
            past: RwSignal::new(Vec::new()),
            future: RwSignal::new(Vec::new()),
            notice: RwSignal::new(None),
            case: RwSignal::new(0),
            checked,
        }
    }

    /// Applies `edit` to a copy of the design and keeps it only if it analyses; otherwise
    /// returns the engine's message and leaves the design (and the screen) as it was.
    pub fn try_edit(&self, edit: impl FnOnce(&mut Design)) -> Result<(), String> {
        let mut candidate = self.design.get_untracked();
        edit(&mut candidate);
        self.check(&candidate)?;
        self.commit(candidate);
        Ok(())
    }

    /// Analyses `design`, keeping the result for the memo; the engine's message if it
    /// does not analyse.
    pub fn check(&self, design: &Design) -> Result<(), String> {
        match analyze(design) {
            Ok(a) => {
                self.checked.set_value(Some((design.clone(), Arc::new(a))));
                Ok(())
            }
            Err(e) => Err(e.to_string()),
        }
    }

    /// Makes `design` current as one undo step (the caller has checked that it analyses).
    pub fn commit(&self, design: Design) {
        let previous = self.design.get_untracked();
        if previous == design {
            return;
        }
        self.remember(previous);
        self.design.set(design);
    }

    /// Records `previous` as the state undo returns to, and forgets what was undone.
    pub fn remember(&self, previous: Design) {
        self.past.update(|p| {
            p.push(previous);
            if p.len() > HISTORY_LIMIT {
                p.remove(0);
            }
        });
        self.future.update(|f| f.clear());
    }

    /// Shows `design` without recording a step (during a drag: the drag as a whole is
    /// recorded once, when it ends). Returns false, changing nothing, when it does not
    /// analyse.
    pub fn preview(&self, design: Design) -> bool {
        if self.check(&design).is_ok() {
            self.design.set(design);
            true
        } else {
            false
        }
    }

    /// Sets the truss member under the pointer (only when it changes, so canvases redraw
    /// once per change, not per pointer move).
    pub fn hover(&self, member: Option<usize>) {
        if self.hovered.get_untracked().0 != member {
            self.hovered.set(Hovered(member));
        }
    }

    /// Steps back one design; false when there is none.
    pub fn undo(&self) -> bool {
        let Some(prev) = self.past.try_update(|p| p.pop()).flatten() else { return false };
        let current = self.design.get_untracked();
        self.future.update(|f| f.push(current));
        self.design.set(prev);
        true
    }

    /// Re-applies the last undone design; false when there is none.
    pub fn redo(&self) -> bool {
        let Some(next) = self.future.try_update(|f| f.pop()).flatten() else { return false };
        let current = self.design.get_untracked();
        self.past.update(|p| p.push(current));
        self.design.set(next);
        true
    }
}

/// Parses a number typed by a user: accepts a decimal point or comma, spaces as digit
/// groups, and rejects anything non-finite.
pub fn parse_number(text: &str) -> Result<f64, String> {
    let cleaned: String = text.trim().chars().filter(|c| !c.is_whitespace() && *c != '\u{202f}').collect();
    let cleaned = cleaned.replace(',', ".");
    match cleaned.parse::<f64>() {
        Ok(v) if v.is_finite() => Ok(v),
        _ => Err(format!("'{}' is not a number", text.trim())),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parse_number_accepts_commas_and_rejects_text() {
        assert_eq!(parse_number(" 12,5 "), Ok(12.5));
        assert_eq!(parse_number("1 200"), Ok(1200.0));
        assert!(parse_number("abc").is_err());
        assert!(parse_number("inf").is_err());
    }
}
