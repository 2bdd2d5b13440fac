package lsp

// The parts of the Language Server Protocol 3.17 this server uses, with
// the protocol's field names. Positions count UTF-16 code units, as the
// protocol's default encoding says (see text.go).

type position struct {
	Line      int `json:"line"`
	Character int `json:"character"`
}

type lspRange struct {
	Start position `json:"start"`
	End   position `json:"end"`
}

type location struct {
	URI   string   `json:"uri"`
	Range lspRange `json:"range"`
}

type textDocumentIdentifier struct {
	URI string `json:"uri"`
}

type textDocumentItem struct {
	URI        string `json:"uri"`
	LanguageID string `json:"languageId"`
	Version    int    `json:"version"`
	Text       string `json:"text"`
}

type versionedTextDocumentIdentifier struct {
	URI     string `json:"uri"`
	Version int    `json:"version"`
}

type didOpenParams struct {
	TextDocument textDocumentItem `json:"textDocument"`
}

type contentChange struct {
	Range *lspRange `json:"range,omitempty"`
	Text  string    `json:"text"`
}

type didChangeParams struct {
	TextDocument   versionedTextDocumentIdentifier `json:"textDocument"`
	ContentChanges []contentChange                 `json:"contentChanges"`
}

type didCloseParams struct {
	TextDocument textDocumentIdentifier `json:"textDocument"`
}

type textDocumentPositionParams struct {
	TextDocument textDocumentIdentifier `json:"textDocument"`
	Position     position               `json:"position"`
}

type referenceParams struct {
	textDocumentPositionParams
	Context struct {
		IncludeDeclaration bool `json:"includeDeclaration"`
	} `json:"context"`
}

type renameParams struct {
	textDocumentPositionParams
	NewName string `json:"newName"`
}

type documentParams struct {
	TextDocument textDocumentIdentifier `json:"textDocument"`
	Range        *lspRange              `json:"range,omitempty"`
}

type codeActionParams struct {
	TextDocument textDocumentIdentifier `json:"textDocument"`
	Range        lspRange               `json:"range"`
	Context      struct {
		Diagnostics []lspDiagnostic `json:"diagnostics"`
	} `json:"context"`
}

type initializeParams struct {
	ProcessID    *int   `json:"processId"`
	RootURI      string `json:"rootUri"`
	Capabilities struct {
		Workspace struct {
			InlayHint struct {
				RefreshSupport bool `json:"refreshSupport"`
			} `json:"inlayHint"`
		} `json:"workspace"`
	} `json:"capabilities"`
}

type diagnosticRelatedInformation struct {
	Location location `json:"location"`
	Message  string   `json:"message"`
}

type lspDiagnostic struct {
	Range              lspRange                       `json:"range"`
	Severity           int                            `json:"severity,omitempty"`
	Source             string                         `json:"source,omitempty"`
	Message            string                         `json:"message"`
	RelatedInformation []diagnosticRelatedInformation `json:"relatedInformation,omitempty"`
	// Data carries the quick fix the hint names, so a code action request
	// gets it back with the diagnostic (see actions.go).
	Data *fixData `json:"data,omitempty"`
}

type publishDiagnosticsParams struct {
	URI         string          `json:"uri"`
	Version     *int            `json:"version,omitempty"`
	Diagnostics []lspDiagnostic `json:"diagnostics"`
}

type markupContent struct {
	Kind  string `json:"kind"`
	Value string `json:"value"`
}

type hover struct {
	Contents markupContent `json:"contents"`
	Range    *lspRange     `json:"range,omitempty"`
}

type inlayHint struct {
	Position     position `json:"position"`
	Label        string   `json:"label"`
	PaddingLeft  bool     `json:"paddingLeft,omitempty"`
	Tooltip      string   `json:"tooltip,omitempty"`
	PaddingRight bool     `json:"paddingRight,omitempty"`
}

// Completion item kinds (LSP CompletionItemKind).
const (
	kindFunction = 3
	kindField    = 5
	kindVariable = 6
	kindUnit     = 11
	kindKeyword  = 14
	kindModule   = 9
	kindFile     = 17
	kindConstant = 21
)

type completionItem struct {
	Label         string         `json:"label"`
	Kind          int            `json:"kind,omitempty"`
	Detail        string         `json:"detail,omitempty"`
	Documentation *markupContent `json:"documentation,omitempty"`
	InsertText    string         `json:"insertText,omitempty"`
	SortText      string         `json:"sortText,omitempty"`
}

type completionList struct {
	IsIncomplete bool             `json:"isIncomplete"`
	Items        []completionItem `json:"items"`
}

type textEdit struct {
	Range   lspRange `json:"range"`
	NewText string   `json:"newText"`
}

type workspaceEdit struct {
	Changes map[string][]textEdit `json:"changes"`
}

// Symbol kinds (LSP SymbolKind).
const (
	symbolNamespace = 3
	symbolFunction  = 12
	symbolVariable  = 13
	symbolConstant  = 14
	symbolBoolean   = 17
	symbolStruct    = 23
	symbolModule    = 2
)

type documentSymbol struct {
	Name           string           `json:"name"`
	Detail         string           `json:"detail,omitempty"`
	Kind           int              `json:"kind"`
	Range          lspRange         `json:"range"`
	SelectionRange lspRange         `json:"selectionRange"`
	Children       []documentSymbol `json:"children,omitempty"`
}

type codeAction struct {
	Title       string          `json:"title"`
	Kind        string          `json:"kind"`
	Diagnostics []lspDiagnostic `json:"diagnostics,omitempty"`
	IsPreferred bool            `json:"isPreferred,omitempty"`
	Edit        *workspaceEdit  `json:"edit,omitempty"`
}
