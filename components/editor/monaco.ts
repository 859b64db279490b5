/**
 * The parts of Monaco the equation editor uses: the editor core and the
 * features a designer reaches (completion, hover, go to definition, find,
 * folding, comment toggling, formatting, marker navigation, multi-cursor…),
 * without the dozens of bundled languages and the features we never show.
 * Loading the whole package costs a main-thread task of about a second on
 * every page open; this keeps the editor's script to what is used.
 */
import * as monaco from "monaco-editor/editor/editor.api";
import "monaco-editor/features/codicon/register";
import "monaco-editor/editor/browser/coreCommands";
import "monaco-editor/features/bracketMatching/register";
import "monaco-editor/features/caretOperations/register";
import "monaco-editor/features/clipboard/register";
import "monaco-editor/features/comment/register";
import "monaco-editor/features/contextmenu/register";
import "monaco-editor/features/cursorUndo/register";
import "monaco-editor/features/find/register";
import "monaco-editor/features/folding/register";
import "monaco-editor/features/format/register";
import "monaco-editor/features/gotoError/register";
import "monaco-editor/editor/contrib/gotoError/browser/markerSelectionStatus";
import "monaco-editor/features/gotoSymbol/register";
import "monaco-editor/editor/contrib/gotoSymbol/browser/goToCommands";
import "monaco-editor/features/hover/register";
import "monaco-editor/features/indentation/register";
import "monaco-editor/features/linesOperations/register";
import "monaco-editor/features/multicursor/register";
import "monaco-editor/features/readOnlyMessage/register";
import "monaco-editor/features/smartSelect/register";
import "monaco-editor/editor/contrib/suggest/browser/suggestController";
import "monaco-editor/features/wordHighlighter/register";
import "monaco-editor/features/wordOperations/register";
import "monaco-editor/editor/common/standaloneStrings";

export default monaco;
