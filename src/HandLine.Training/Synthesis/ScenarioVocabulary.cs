namespace HandLine.Synthesis;

/// <summary>
/// Words of the invented scenario: the Quillhaven estate's account books and the register of
/// Foxmere parish. Every person, farm and place is made up from common given names and plain words.
/// </summary>
internal static class ScenarioVocabulary
{
    public const string Estate = "Quillhaven";
    public const string Parish = "Foxmere";

    /// <summary>Given names with the clerk's usual abbreviation (same as the name when none).</summary>
    public static readonly (string Full, string Short)[] MenGiven =
    [
        ("William", "Wm."), ("James", "Jas."), ("Thomas", "Thos."), ("John", "Jno."), ("George", "Geo."),
        ("Charles", "Chas."), ("Joseph", "Jos."), ("Richard", "Richd."), ("Robert", "Robt."), ("Henry", "Hy."),
        ("Edward", "Edwd."), ("Samuel", "Saml."), ("Benjamin", "Benj."), ("Isaac", "Isaac"),
        ("Zachariah", "Zach."), ("Ezra", "Ezra"), ("Daniel", "Danl."), ("Nathan", "Nathan"),
        ("Oliver", "Oliver"), ("Peter", "Peter"), ("Uriah", "Uriah"), ("Walter", "Walter"),
        ("Frederick", "Fredk."), ("Alfred", "Alfd."), ("Abel", "Abel"), ("Luke", "Luke"), ("Mark", "Mark"),
        ("Job", "Job"), ("Amos", "Amos"), ("Matthew", "Matt."),
    ];

    public static readonly string[] WomenGiven =
    [
        "Mary", "Ann", "Sarah", "Elizabeth", "Jane", "Hannah", "Martha", "Susannah", "Esther", "Fanny",
        "Lucy", "Ellen", "Grace", "Harriet", "Kezia", "Ursula", "Violet", "Phoebe", "Queenie", "Agnes",
        "Dinah", "Olive", "Rose", "Tabitha", "Zillah", "Bridget", "Constance", "Judith", "Nancy", "Yolanda",
    ];

    /// <summary>Surnames built from plain words.</summary>
    public static readonly string[] Surnames =
    [
        "Appleyard", "Birchwood", "Dovecote", "Eastbrook", "Fernside", "Gatehouse", "Hollowell", "Inchmore",
        "Juniper", "Kettlewood", "Longstaff", "Millward", "Nettlebank", "Oakhurst", "Pebbleford", "Quickthorn",
        "Quillfoot", "Rushbrook", "Stonebridge", "Tallowfield", "Underhay", "Vetchford", "Wheatcroft",
        "Yarrowby", "Zealwood", "Fairweather", "Brookman", "Marlpit", "Oxenbury", "Thornhedge", "Ploughwright",
        "Bramblecot", "Cowslip", "Haybarn", "Lambkin", "Saltcote",
    ];

    public static readonly string[] Farms =
    [
        "Oxlease Farm", "Hazelbrook Farm", "Quarry Bank", "Kettlebrook", "Mossgate", "Yarrowfield",
        "Zinnwood", "Upperfold", "Juniper Hill", "Vetch Close", "Windle Croft", "Home Farm", "Mill Cottage",
        "Glebe Cottage", "Nether Quillhaven", "Lower Foxmere", "Ivy Lodge", "Rookwood End",
    ];

    public static readonly string[] Places =
    [
        "this parish", "Foxmere", "Quillhaven", "Foxmere Green", "Zinnwood", "Kettlebrook", "Oxlease",
        "Mossgate", "Upperfold", "Quarry Bank", "the Lodge", "the Mill", "Yarrowfield",
    ];

    public static readonly string[] Trades =
    [
        "labourer", "carpenter", "blacksmith", "wheelwright", "carter", "shepherd", "miller", "yeoman",
        "farmer", "tailor", "cordwainer", "dairymaid", "servant", "glazier", "mason", "quarryman", "sawyer",
        "saddler", "wax chandler", "ploughman", "cooper", "grocer", "exciseman", "gamekeeper", "joiner",
        "journeyman", "thatcher", "hedger", "bricklayer", "schoolmistress", "widow", "spinster", "pauper",
    ];

    /// <summary>Unit abbreviation and goods that are sold in it.</summary>
    public static readonly (string Unit, string[] Goods)[] Measures =
    [
        ("bush.", ["barley", "wheat", "oats", "malt", "beans", "potatoes"]),
        ("qrs.", ["wheat", "barley", "oats"]),
        ("cwt.", ["hay", "coal", "flour", "cheese", "iron"]),
        ("lb.", ["wax", "candles", "butter", "soap", "tea", "sugar", "nails"]),
        ("doz.", ["eggs", "hurdles", "sacks", "candles", "bottles"]),
        ("gall.", ["ale", "milk", "vinegar", "lamp oil"]),
        ("yds.", ["flax", "calico", "linen", "fustian", "rope"]),
        ("pr.", ["boots", "shoes", "gloves", "hinges"]),
        ("qt.", ["vinegar", "ale", "quicklime", "oil"]),
        ("loads", ["straw", "timber", "gravel", "quarry stone", "faggots"]),
        ("tons", ["coal", "lime", "zinc"]),
    ];

    public static readonly string[] Services =
    [
        "mowing", "thatching", "hedging", "ditching", "shoeing the ox", "mending the gate", "carriage",
        "sheep washing", "glazing", "threshing", "quarrying", "jobbing work", "wax & quills", "taxes",
        "the Xmas dole", "sexton's fee", "tithe", "church rate", "poor rate", "quit rent", "oxen hire",
    ];

    public static readonly string[] MonthsFull =
    [
        "January", "February", "March", "April", "May", "June",
        "July", "August", "September", "October", "November", "December",
    ];

    /// <summary>Month abbreviations a clerk used (several per month).</summary>
    public static readonly string[][] MonthsShort =
    [
        ["Jan.", "Jany."], ["Feb.", "Feby."], ["Mar.", "Mch."], ["Apr.", "Aprl."], ["May"], ["June", "Jun."],
        ["July", "Jul."], ["Aug.", "Augt."], ["Sept.", "Sep."], ["Oct.", "Octr."], ["Nov.", "Novr."],
        ["Dec.", "Decr."],
    ];

    public static readonly string[] Roman =
        ["I", "II", "III", "IV", "V", "VI", "VII", "VIII", "IX", "X", "XI", "XII", "XIV", "XIX", "XX", "XL", "LX", "XC"];
}
