package report

// Cautions is the statement every workbook summary and memo carries
// (spec §13).
var Cautions = []string{
	"This is a planning aid, not a test plan or a design check.",
	"Scale effects remain in every model test, including the strategies recommended here; the windows rest on the laws, limits and property values of the study.",
	"The final test plan and any design decision rest with qualified engineers, the facility's operating rules and the applicable codes and classification rules.",
}
