//! Small writes to the page's elements that the views make outside the framework's own
//! updates (tables whose rows are rewritten by one effect each).

use wasm_bindgen::JsCast;

/// Makes `text` the whole content of `element`. When the element holds exactly one text
/// node, that node's data is changed in place; otherwise its children are replaced by a
/// new text node. In place, the browser keeps the node and its layout box and only
/// reshapes the text, where replacing the children would build both anew: result
/// numbers change on every edit, some fifty cells at a time.
pub fn write_text(element: &web_sys::Element, text: &str) {
    let only_text = element
        .first_child()
        .filter(|first| first.next_sibling().is_none())
        .and_then(|first| first.dyn_into::<web_sys::Text>().ok());
    match only_text {
        Some(node) => node.set_data(text),
        None => element.set_text_content(Some(text)),
    }
}
