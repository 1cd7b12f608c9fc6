// GENERATED — do not edit by hand. The common passwords the password rule refuses (password.ts).
//
// Source: the npm package @zxcvbn-ts/language-common 4.1.3, file src/passwords.json (the
// "passwords-common" dictionary of zxcvbn-ts, ranked by frequency in leaked password sets).
// Licence: MIT. Copyright (c) 2012-2016 Dan Wheeler and Dropbox, Inc.; Copyright (c) 2021
// @zxcvbn-ts. Permission is hereby granted, free of charge, to any person obtaining a copy of
// this software and associated documentation files (the "Software"), to deal in the Software
// without restriction, subject to the condition that the copyright notice and this permission
// notice shall be included in all copies or substantial portions of the Software. THE SOFTWARE
// IS PROVIDED "AS IS", WITHOUT WARRANTY OF ANY KIND.
//
// Kept from its 49233 entries: every entry of 12 characters or more (308; shorter ones
// are refused by the length rule already), and the entries among the 10 000 most frequent that
// start and end with a letter and have 4 to 11 characters (7284), which the rule also
// refuses with digits or symbols added around them, or repeated ("Password2024!", "qwertyqwerty").
// One entry per word, separated by spaces and line breaks (no entry has a space, a backslash, a
// backquote or a dollar before a brace).
export const COMMON_PASSWORDS_TEXT = `
123qweasdzxc 1qaz2wsx3edc q1w2e3r4t5y6 1q2w3e4r5t6y mailcreated5240 qazwsxedcrfv 123456qwerty qwerty123456
polniypizdec0211 sojdlg123aljg leavemealone motherfucker 123456654321 gfhjkmgfhjkm qazwsxedc123 ghjcnjgfhjkm
zxcasdqwe123 sonyericsson ghhh47hj7649 123456789qwe 1qazxsw23edc masterbating qwerasdfzxcv qweasdzxc123
flvbybcnhfnjh 123456789987654321 112233445566 ghbdtnrfrltkf websolutions finalfantasy 1qaz2wsx3edc4rfv
chickenwing101 unbelievable administrator 123321123321 justinbieber contortionist 123qwe123qwe newproject2004
pornographic masturbation needforspeed businessbabe 123456789123 masterbaiting maurolarastefy supernatural
professional domainlock2005 scandinavian dkflbvbhjdbx momsanaladventure hd764nw5d7e1vb1 qazwsxedcrfvtgb
123456789012 dkflbvbhjdyf counterstrike zaq1xsw2cde3 vfvfvskfhfve 123456789abc fkmnthyfnbdf intelligence
ghjcnjghjcnj admin18533362 23176djivanfros 123456789qwerty qazxswedcvfr qwertyasdfgh whosyourdaddy
1111111111zz fktrcfylhjdbx fktrcfylhjdyf 541233432442 123456789qaz ghbdtnghbdtn password1234
12345678900987654321 chesterfield 010203040506 lost4815162342 102030405060 vanyarespekt qwerty123456789
89231243658s iseedeadpeople transformers devilmaycry4 combat123654 qwertyytrewq jamesbond007 123123qweqwe
4815162342lost 123456789qqq asdfghjkl123 1234qwerasdf 123qwe456rty 1234567890qw ghjcnjrdfibyj qwertyuiop123
international saun24865709 q1w2e3r4t5y6u7 ptybnxtvgbjy polniypizdec110211 1qa2ws3ed4rf 123456789zxc
12345678987654321 playstation3 31217221027711 fucktheworld 159753159753 mevefalkcakk 1234567890qwe
hedimaptfcor cosmopolitan q1w2e3r4t5y6u7i8 zqjphsyf6ctifgu lhbjkjubz2957704 123456782000 andrewjackie
1qazxsw23edcvfr4 12qw34er56ty christopher1 159753456852 networkingpe philadelphia peanutbutter boy4u2ownnyc
ingodwetrust minecraft123 digitalprodu installdevic an83546921an13 qawsedrftgyh abc123456789 123321qweewq
auckland2010 residentevil olcrackmaster 1234567890zzz 32615948worms 012345678910 fuckyoubitch avrillavigne
massimiliano nhfdvfnjkju123 742617000027 41d8cd98f00b nemvxyheqdd5oqxyxyzi temppassword p030710p$e4o
punksnotdead fynfyfyfhbde nightcrawler playstation2 gjkysqgbpltw ticketmaster 01telemike01 stratocaster
ghjcnjqgfhjkm installsqlst 123456789101 1234567890qaz frederiksberg 1a2s3d4f5g6h passwordpassword schoolgirlie
sanfrancisco 89876065093rax 1234567qwertyu lytghjgtnhjdcr 111222333000 nhecsyfujkjdt zaqwsxcderfv seemnemaailm
qwaszxerdfcv antananarivu greenlantern qazwsxqazwsx vfrcbvvfrcbv 1234qwerasdfzxcv iloveboobies ghjcnjgbpltw
123321456654 1234567890987654321 1234567890qwerty q1w2e3r4t5y6u7i8o9p0 morganstanley 59382113kevinp
qwe123qwe123 gtnhjpfdjlcr zxcvbn123456 bltynbabrfwbz warhammer40k passwordstandard maprchem56458 construction
bpgjldsgjldthnf iampurehaha2 qazxswedc123 qwertyuiop10 stinkyfinger cjdthitycndj corperfmonsy weihnachtsbau
1234567892000 1234567887654321 stickdaddy77 123456789000 014702580369 asdfgh123456 necronomicon mortalkombat
123qwerty123 systemofadown qaz123wsx456 nastyanastya zxcvbnm123456789 satisfaction cheeseburger a1s2d3f4g5h6
minnesota_hp 122333444455555 vladimirovna 111222333444555 ilovemyfamily michaeljackson vfhbyfvfhbyf
qwertyuiop12345 1qa2ws3ed4rf5tg websolutionssu amadeusptfcor specialinsta 123456789asd nhfycajhvths
rfnthbyf1988 paraklast1974 webuivalidat msorcloledbr nondriversig 123456789qwer wazzkaprivet weihnachtsbaum
fktrcfylhjdf z1x2c3v4b5n6m7 ghjnbdjcnjzybt qwertyuiop12 sonnenschein anytimetoday ntktdbpjh1994
nick1234-rem936 thecakeisalie ontheoutside zcfvfzkexifz xxxp455w0rd5 qwertasdfgzxcvb ghjatccbjyfk
aksjdlasdakj89879 23wkoa0fp78dk marinamarina fatima753357 6215mila6215 zaq12wsxcde3 love777321777 123456789aaa
4815162342lf pfqwtd27121988 cnfc35762209 12345677654321 zxcvbnmmnbvcxz civilization findaupair007
alpha135792468 ghtdtlvtldtl edwardcullen gfhfktkjuhfv qazwsx123456 lytdybrbdfvgbhf asd123asd123
passwordassword ronaldinho10 ipo54tj45uy856 89semtsriuty foreveryoung sdicmt7seytn blacksonblon
420842084208555 ktjynsq40147 1a2a3a4a5a6a bullnuts2003 050605rostik 19960610ilja 123456zxcvbn z1x2c3v4b5n6
entertainment 89063032220m badiman28200 123ewqasdcxz nhbujyjvtnhbz polniypizdec1102 ne_e_pod_chehyl
hd764nw5d7e1vbv josephphone7 gthtrfnbgjkt configuratio msoracle32re bhrh0h2oof6xbqjeh 193570356033 password
qwerty dragon baseball football monkey letmein shadow master michael mustang qwertyuiop pussy superman fuckyou
jordan qazwsx jennifer killer hunter harley zxcvbnm asdfgh buster andrew batman soccer tigger charlie robert
sunshine thomas iloveyou fuckme ranger daniel hockey george computer michelle jessica starwars asshole pepper
klaster zxcvbn freedom princess joshua maggie pass ginger fuck amanda ashley love cheese nicole summer matthew
chelsea dallas biteme matrix william yankees taylor corvette austin access martin heather thunder merlin
secret diamond hello anthony hammer fucker silver gfhjkm justin patrick richard bailey internet samantha
golfer scooter test orange cookie maverick jackson sparky mickey phoenix bigdog snoopy guitar whatever chicken
morgan andrea camaro mercedes peanut ferrari cowboy falcon welcome samsung sexy steelers joseph smokey dakota
melissa arsenal boomer eagles tigers marina nascar booboo gateway porsche yellow monster spider diablo hannah
bulldog junior london purple compaq lakers iceman hardcore cowboys money banana boston brandon tennis johnny
miller coffee scooby edward nikita mother yamaha brandy barney chester fuckoff oliver charles player knight
forever steven rangers midnight chicago bigdaddy redsox victoria badboy angel please fender chris jasper james
slayer rabbit natasha rachel bigdick marine wizard marlboro raiders prince casper fishing flower crystal
jasmine panties iwantu adidas winner winter gandalf enter ghbdtn angela mike golden lauren cocacola winston
madison angels blowme panther sexsex bigtits spanky bitch shannon sophie johnson asdfasdf david horny toyota
tiger murphy dick canada danielle blowjob jonathan liverpoo muffin cooper apples jackie dennis black passw0rd
john sandra pokemon slipknot carlos qazxsw scorpion qwaszx nathan butter startrek rainbow asdfghjkl razz
redskins newyork gemini cameron qazwsxedc florida liverpool turtle nicholas viking booger wilson sierra
butthead doctor rocket victor dolphins captain bandit jaguar packers pookie peaches asdf blue dolphin helpme
tucker theman tiffany maxwell jeremy qwertyui shithead debbie albert maddog lovers monica alex united giants
nirvana metallic hotdog rosebud mountain benjamin warrior stupid elephant suckit success jackass bonnie alexis
porn lucky jason scorpio samson azerty freddy driver willie calvin sydney gators dexter bubba creative golf
voodoo happy arthur trouble america nissan gunner rebecca stella garfield gordon jessie bullshit parker
asdfghjk fucking apollo jack eminem december legend airborne beavis august bear apple brooklyn godzilla skippy
buddy qwert kitten magic shelby beaver phantom fred nothing asdasd williams xavier braves darkness travis
copper tomcat platinum qweqwe girls bigboy green power animal police online voyager lifehack fish sniper
trinity walter blazer heaven lover snowball playboy bubbles loveme hooters cricket marvin willow donkey topgun
nintendo saturn family november gabriel destiny pakistan pumpkin digital sergey chance explorer redwings
private therock runner tits lasvegas guinness beatles fire cassie christin celtic broncos andrey babygirl
nelson donald scott eclipse cartman fluffy louise michigan testing carolina little samuel alexande birdie
steve cherry pantera sharon gibson vampire mexico dickhead peter buffalo montana genius beer flyers maximus
school minecraft lovely stalker metallica doggie carter kristina kimberly spencer speedy barbara snickers
sabrina carmen marcus bronco yankee friends paradise dreams magnum horses cool caroline lacrosse goober member
qwertyu enigma scotty pimpin bollocks brian cock surfer sammy genesis poohbear dave star qweasdzxc baby racing
friend hawaii billy viper october vanessa poopoo einstein boobies stanley walker bitches paul drowssap stephen
courtney simple alaska badger action jake bill denise jester spitfire drummer forest patricia maryjane
champion diesel svetlana rock friday kevin mark gregory pamela frank hotrod chevy anderson douglas westside
security google badass shorty tester thumper hitman mozart general reddog boobs zaq12wsx music lizard
alexander melanie ruslan vincent eagle sweet teresa scarface marshall olivia veronica porno buddha spirit
frankie stargate antonio liberty natalie mercury naruto suzuki semperfi king popcorn spooky marley system
brittany claudia kelly scotland free kitty cherokee vikings simpsons death leslie rascal qweasd jimmy loveyou
hummer allison rocky patches russia adrian jupiter penguin cumshot howard passion honda vfhbyf andre vladimir
franklin sandman infinity homer bastard raider passport assman sucker fantasy bulldogs horney domino budlight
ironman disney norman softball bishop francis brutus ford redrum brooke bigred jeffrey jesus fktrcfylh karina
marines kawasaki digger ireland oksana fireman cougar college shit alicia russell houston monday bradley cunt
sarah nigger justice super wildcats tinker duncan dancer logitech avalon swordfis everton reggie motorola
alexandr molly timothy hentai claire patriots madonna colorado eugene ducati kermit juventus indian connor
galore freeuser smooth house titanic boogie simpson warcraft wolverin elizabet arizona saints valentin georgia
asdfg accord matt baxter denver mitchell christ yfnfif slut smith stinky zachary roland naughty ncc1701d
spiderma chopper brenda extreme virginia water skyline poop zombie pearljam froggy pirate fylhtq vision
awesome alyssa dreamer predator bullet empire wolf kirill people penis elvis panthers skipper nemesis peekaboo
simon alison rolltide american cardinal arnold chevelle daddy psycho danger mookie wanker manutd tommy hobbes
vegeta goblue burton fyfcnfcbz picard bobby windows loverboy lovelove vfrcbv victory bambam turkey serega
tweety hiphop galina changeme rooster polina berlin suckme taurus electric ronald avatar mine raptor maksim
spring brazil eric bigcock newport hard kenneth hendrix madmax england alpha sublime britney france darkside
bigman hercules lawrence wolfpack classic lincoln ronaldo spiderman blizzard cheyenne wombat cjkysirj raymond
brother kristen pandora devils simone holiday wildcat horse kramer sterling caesar alabama carrie bondage
basketball sports pussycat pickle leather shaggy chronic flowers robbie admin gracie amber freepass airplane
perfect kodiak billybob katana sunset crazy good stingray maria anna snowman phpbb chocolat zeppelin garcia
detroit wolves pontiac candy firebird vagina gundam panzer outlaw time pretty fisher connie honey business
trevor redhead hardon greenday tarheels nastya hellfire cobra engineer savage service serenity sasha michele
dude lickme fireball white remember darkstar miranda flash harvey oscar strike freddie pavilion beauty
bobafett adam dbrnjhbz jeff bigmac duke clinton bowling jenny natali future harrison jones wallace swimming
apache rulez pyramid dodgers girl whynot fuckit defender teens morris trooper cancer precious packard lucifer
popeye weasel raven icecream stewart tanner swordfish blonde sandy presario rockstar viktor manager cheryl
norton control wutang airforce julian atlanta pimp spike thailand looking casino paris mouse lennon bluebird
theone hawkeye hacker lisa dustin elaine nfnmzyf sailor catfish goldfish maxima tattoo barbie light design
pervert machine herman wrangler rocks trucks nipples roscoe tornado jerry lights bubble cadillac madman
orlando pegasus target longhorn laura philip browns eatme stefan cannon dilbert baller microsoft winnie
christia katie shooter xfiles qazqaz lesbian street seattle corona amateur cthutq prelude beach malibu freaky
assassin integra atlantis pussies dragons iloveu unicorn lonewolf regina stealth kristin tony peewee openup
bobcat stacey software newton leonardo student srinivas angelina young enjoy valentina trigger zaqwsx lolita
athena shotgun coyote bruins veronika dollar country joker babydoll lestat wordpass hottie smiley potter
random sweety butterfly woody chipper snake samurai video gizmo maddie devildog valerie mistress flipper
express powers soso123aljg cessna teacher goldie moose polaris piglet cookies elena montreal hjvfirf ladies
wolfgang fatboy scully father single wicked daisy fetish foobar castle tickle bunny pepsi balls transam dfvgbh
impala sunday booty hotstuff ronnie jasmin ryan gambit toshiba basketba lancer birthday texas stephani hooker
knicks roberto stinger testtest kathleen savannah shamrock benson squirt deftones trucker nick redneck
goldberg alfred blaster siemens shelly renegade manson subaru ibanez blondie hamilton casey swinger reaper
cristina minnie mylove harry galaxy lindsay dudley farmer gloria special blahblah enterpri travel bigone
sweetpea sugar smoke skeeter fucked indiana great ficken trfnthbyf freeman curtis smitty marino joanne bigfoot
escort babes check larisa trumpet tristan spartan babylon asdfghj sister valera stormy paladin andreas
cavalier marathon hamlet aardvark butterfl bigboobs mister manchester rusty napoleon seven indigo hornet
skater jerome pierre wonder toronto rose indians karate buckeyes julie hesoyam fredfred charger highland
sweetie holland chiefs diamonds buckeye aurora hotsex campbell griffin brandi redman passwor chandler drpepper
monika maiden elizabeth leonard bernie brown pornstar garden storm autumn linda thuglife millie jungle pencil
tomtom insane pizza timber sherlock mariah audrey hamster aragorn pioneer techno catdog lollol triumph sidney
fktrctq none sophia morpheus island wetpussy hobbit blabla erotic aaron pascal sampson consumer justme marion
stones chrissy tyler nadine marie goforit burger pitbull kelsey adgjmptw spartak german karen kissme hunting
kaiser martha colors artist harold bass italia sammie barcelona mario nicolas virgin pebbles sundance isabella
overlord emerald callie doggy irina racecar isabelle germany goddess change wesley nipple basket joejoe holly
poison zipper alpine shirley element huskers marcel eddie danny christy pussys sakura chichi inside ultimate
dirty nicola ncc1701e blackie omega watson rommel geronimo nikki caserta trojan philips sergio nugget tarzan
bassman warren trixie chicks aleksandr cream webster help sherry manuel portugal dodger anakin bobbob bomber
michel madness superfly loser florence yvonne fatcat global ybrbnf energy desire soldier bianca sexual warlock
martina babe andrei larry seminole peace alejandr westham concrete harris margaret hector christop naked
ladybug network bernard weed tintin qazxswedc trombone chuck pleasure rhbcnbyf home history bluesky sherman
logan january onelove cotton christian cdtnkfyf sunny archie holden whore brianna vfvjxrf titans stallion
lindsey singer truck smile party missy hansolo angelo joanna natalia beagle phillip panama smiles juice qawsed
inferno moon mongoose connect kingkong snatch flatron sex4me bluemoon turbo rocker personal emily blessed
snakes dominic joey forget finger beetle jamaica alberto mulder jamie susan immortal head passat plastic
dietcoke spunky suck long whiskey monitor giovanni cactus ripper spyder markus planet teen patton exigen
sticky waters sluts nolimit daniela hollywoo abigail morrison katrina trunks andy assass always diana deedee
clifford april speed japan mission pickles million sailing freak holmes bonehead fernando ghbdtnbr charlott
delta yomama darren rubber newman faster cumming bertha memphis sylvia open ilovesex maurice hongkong olga
jumper unreal geheim rodney nylons sebastia pentium legion shalom kennedy brooks movie dodge dream graham
sprite curious pacific loulou funtime philly ferret niners orion werewolf milton cantona kingdom stars africa
office boeing gilbert abgrtyu pirates sheila french sweets cooldude palmer eternity lollipop tottenha stocking
monique anything foster irish jackoff biscuit drizzt camera columbia fossil moomoo makaveli tracey robinson
isabel martini salmon shasta jersey verbatim maniac snapper nasty solomon patriot jacob standard shaved
blackcat asdzxc punkrock raistlin infantry dillon gerald twister ricardo waterloo cjkywt clayton crimson
serena oxford maxmax denis flight condor seinfeld silvia biggie maxine musicman ravens teddy colleen bruce
wolfman sharks megadeth cosmos velvet butt keeper foxtrot garrett damien anton sesame skywalke banshee cats
squirrel wolverine dogs sunrise rick ghost western grendel sucks roxanne privet legolas frog felix marlin
stone herbert lvbnhbq qazwsxed carrot blades frosty stardust helena brownie groovy penny butler coolio
twilight daytona licker peanuts intrepid pikachu trains mollie vanhalen jericho hershey strider lobster
punisher grace bird bottom ninja murray kansas shogun goblin search neptune ball showtime darwin amadeus
suzanne fuckfuck oldman bruno showme henry getsome muscle obiwan support rfrfirf skittles ekaterina gold
whitney shark maestro anal danni tanker english tarheel fighter thanks hannibal capital newlife anubis gothic
chaos blues cindy sabine roman preston princes brendan slick evelyn python richie tequila boss cody devil
clover delete mirage blood surfing bentley portland potato baggins review porter chubby panasonic sandiego
sooners buffy buck tina derrick penelope blackdog harmony fusion dima mature malcolm allen mary buttons
californ safety playtime dagger moscow swallow warriors byteme stimpy gangster lucas christine turner iverson
lester chargers liquid mushroom cracker dingdong misty nymets robin bigguy mobile tazman greg nimrod newpass
miami crusader bugger stranger dkflbvbh anastasia marco volume masters monroe miguel doodle collins powder
archer gotcha battle dublin slapshot guardian janice charly septembe photos knights short angelica nookie
milano scarlett stuart damian grizzly camille scruffy brasil latino kittycat poopie munchkin lorenzo rammstein
bananas barcelon santiago thegame hell world gerard picasso walnut kolobok blackman wisdom trance starcraft
parrot quality blade pink auburn goodluck eatshit dorothy dusty engine coltrane gorilla wheels katerina tamara
postal fuck_inside luther carlo cassidy discover oakland spanking osiris dumbass lonestar ping bridge bingo
bender annie stonecol dookie meridian sally megaman racerx rjntyjr sirius firefly julia alexandra madrid terry
griffey women phoebe weezer beautiful violet ledzep lowrider randy gangsta ghjcnj paradox tacobell loving
catalina vertigo halflife carson sergei shiloh johnjohn sobaka buffett aliens sadie chucky bonjour kangaroo
jazz josh thompson sinner socrates keyboard stevie jeep trebor finish dark luke sprint shazam lady national
celica scarlet hoover sommer frances hotboy cynthia qwerasdf penguins bond formula rebels fuckface elwood
melvin vacation kiss ragnarok bollox lexmark lorraine claude rockon duck dodgeram tacoma romeo wookie prodigy
tempest vfhecz flames sebastian colombia bang kitkat oblivion mystery sithlord server molson mustangs incubus
smoker window scoobydo rescue bigballs carpet titleist richmond director lawyer megan juan magnolia celeste
melinda lucy wright jimbob golfing kenny roger bobbie xanadu tardis blueeyes hearts dixie pooper shaman
mersedes springer imagine janine kenwood dogg garbage martinez topper roberts lizzie ashton elliott oracle
sheena chloe nuttertools mallard analsex shemale mikey asterix faith monkeys imperial jimbo cooler grateful
gillian peterpan kingston yourmom sleepy gremlin printer hudson pa55word stud freckles birdman aussie esther
defiant margarita deadhead polo anime tatyana jackal frogger bridget wayne research tobias mariners rootbeer
blondes donnie katrin weather aspirine frederic parola photo children account israel stephanie shaolin noodles
celine willy willis forgot hallo mandy rogers palace santos ohyeah magnus laurie creampie amazon kisses queen
ludwig fatass plymouth justdoit assfuck nellie putter broken nopass letsgo bryan bones tatiana camel champs
lightnin massive camelot bosco deanna gizmodo spidey caliente aezakmi goodtime mypass roller catherin active
pooh payton lonely redalert brucelee smokin porkchop astros aquarius thankyou atomic fletcher shopping mason
marian vanilla unknown sapphire temple marvel beckham kaktus myself sooner blacky hastings blackjac aggies
scream picture judith iforgot kasper cxfcnmt bangkok shitty spectrum eduard vader jammer painter primus
veritas ernest kristi chevrole amsterdam slappy valley pete hitler clancy spankme granny avenger satan
rosemary husker candyman beatrice scrappy simba falcons dylan harder atlantic labrador smudge syracuse
southern melody timmy elijah center darling throat stuff fatman krishna sanchez pancho gator pacman commando
vulcan bush clitoris lemons alice boner keith odessa barkley monopoly method kelley sara punkin pineappl
celtics lesbians space gangbang bennett lick flyboy hamburg asian carol spartans tricky romashka snuggles boat
infiniti anders billie life drago blake hermes jesse goose jeremiah vivian annette homerun dead forrest
carolyn topcat hayden cosworth vectra grover goodbye charlotte cuddles bossman horndog doberman gary telefon
dawg qawsedrf ivanov durango peugeot franco kyle plumber bell rbhbkk pauline exigent laguna emmanuel webmaster
bowler leopard strong theking redbull alan pics beast viktoria breeze topdog starbuck dance dalton fuckers
hungry beefcake reality gjkbyf speaker shelley godsmack clarence writer loveit kingpin nokia valhalla night
starfish anarchy herbie blacks content sailboat desert fitness brando bohica achilles tractor ncc1701a drake
bull hidden kicker labtec napass bart pa55w0rd amelia tuesday frontier swingers caitlin muppet terror legacy
farside terminator bella matilda kentucky doughboy ramona butthole phillies jrcfyf camels dannyboy oakley
nebraska latin double qwertyuio sabbath chang pinkfloy homers striker looker fallen maryland luckydog azamat
september iguana oklahoma moloko vfrcbvrf javier vette daniil command rhonda studio pistol miles skiing franky
stoner conrad select tanya houses boris puppy elliot charmed vladik nathalie whocares maynard vkontakte
ihateyou puppies zidane eileen dilligaf crash mandingo moneys tyrone funny nevada kotenok mystic california
budman church carlton rafael technics bone stick golfball rookie panda laptop today jennie triton river
trojans bunghole zvezda hurrican central stripper dale filter jethro snow gustav ivan escape hawk igor
aberdeen shane lespaul rfnthbyf enterprise butch dthjybrf cutter splash handsome oilers randall cash nofear
cupcake excalibu momoney gbpltw bigger belinda svetik possum metal moocow brothers bethany keystone babyboy
flamingo firefox bogdan ccbill passwort soleil lancelot vipers marilyn tdutybq juliet leader madden russian
australia sabina chase coolman babies skinny zaphod kamikaze verona bacon noodle rebel doobie designer deadman
attack vortex killme dogman gopher somethin danila reagan cancel torres freaks azsxdc sassy donna dracula play
poncho bearbear boots engage deskjet bradford hammers deeznuts warhammer tight justine ralph fabian lewis
blueblue marissa oregon bubbas sinatra hilton meatball mailman dawson columbus manchest cthulhu macdaddy
mighty michaela grandma ready sterlin cartoon summit sentinel tolkien bicycle blow beverly breast lickit kathy
meghan universe capone jenna julius wendy bryant truelove helen nancy eatpussy hailey chair bowser kathryn
sexygirl fernand eleven rockets billyboy military demon davis jamesbon iloveyo traffic saint redhot microsof
sonic miracle microlab gofish pantyhos pilot lifetime rugby mayday aikido nina conner cutlass tree thekid
theodore titties sweden function polska danie gang market scotch lansing elvira bloody sexx hustler anfield
coke smut catman rush bonita tracy sony fast cheers tinman airbus peters china azsxdcfv santana hayley station
gabrie scottie orioles charlton saun fortuna dfkthbz rustam warlord retard fatima ultima kong bigmoney rotten
betty grumpy oranges superstar asdfjkl boxing xtreme denali selena zxcasd huskies terminal wilbur kristy
wildfire vladislav bikini thor hollywood mayhem sultan gretchen figaro sixers sparta saratoga running models
mojo greenbay cancun marlene trinidad tammy chewie hope feet crunch bigbird mellon bigtime fashion piccolo
fabie rjirfrgbde rovers meatloaf hyperion sandro rightnow jarhead armani treasure miriam hansen natural
lisalisa sport bizkit maradona sayang charli rfhbyf utopia anaconda japanese camilla coconut govols emerson
memory catherine jedi cosmo cruise giant ricky dragoon woofwoof giorgi packer poontang illini christopher
davids zaqxsw pedro sticks revenge exodus reebok chanel albatros cabbage goku wally beaner quincy greens
tomato toby chief richards adriana kenworth deborah down cooter dinosaur holyshit eeyore movies dana lionking
creamy adult poodle tsunami happyday knopka bogart corrado volley chickens orgasm whisper flying first
chocolate walleye hopper sean twisted chaser memorex ericsson jensen positive crazybab science frisco dong
jose zorro romance sherwood shania rereirf sausage milana tasha vfvekz profit zenith fugazi junebug clemson
tootsie fktrcfylhf comics zxcasdqwe vfczyz werner aspire hardrock condom cocks rachael gringo anhyeuem
madeline rich becky canon february alien harper stocks marcos clapton roberta coleman applepie skywalker fubar
theresa koshka tundra vitalik arjay gmoney bigsexy ingrid pillow fingers samiam dean davidson skorpion candle
nobody hellyeah better australi drew rockhard boob easy bears sparkle johanna everest rfrnec hedgehog wolfie
surf fart yosemite marisa voyeur baddog brad jazzman dicks tool temp cheetah slacker steele mikemike wood
pooppoop barsik valeria deniska br0d3r fright karolina kirsten vfksirf kume kenshin bootie cyclone starship
monty balloon maxell dildo rupert milena bonsai lion salvador greatone vernon slider lillian admiral cecilia
stolen albion boys midget fuckin freeporn nikola hithere damnit dinamo francois cheng calico duchess scratch
powell stefano fortune nyjets artemis robotech roadkill backdoor rastaman fiesta felicia alliance fletch
jerkoff killbill goliath cinnamon rambler malaka tekken carrera bangbang jeanette marc fritz ramses operator
shado duster spank wibble alibaba mechanic keywest sword amsterda bristol pingpong rasputin marianne hooter
tara rctybz sanders faggot krista presto majestic nguyen fowler passwords buttman spurs carl pompey trident
viagra kipper kingfish gotohell angie guest garage heidi mattie slutty isaiah steeler wrestlin pooter divine
emma clipper charley macross railroad oleg seamus swimmer jokers thursday chico solnce erik kimber guiness
pussie mathew nature matador sparks typhoon hank retired subway slave ivanova ghetto florian vermont tang
ktyjxrf lolipop spears yzerman peterson magick phillips cinder nwo4life shearer pupsik dfkthf allsop city
grapes pippen belle chad venus kcj9wx5n dammit barry caveman critter underdog r2d2c3po skydive renault onlyme
murder snoopdog jayhawk hotshot caramel broadway kinky theboss fuckher train trout ding umbrella feather
credit splinter depeche seeker fuckthis respect crysis direct animals chemical cyclops chivas jamesbond
blackhaw passpass sinclair team megapass beanie translator helloo magicman cunts phil fishes supersta giuseppe
caligula kill juggalo frozen quattro usmc meredith java wassup rosie bullseye saturday pornos cohiba floppy
alucard deacon heart tabitha kristine tunafish dkflbckfd kickass vietnam kendall pearl safari gonzo crawford
klingon rain looser goalie damage maureen west dawn tazmania cigars facial deepthroat malina silence samara
dfktynbyf fang cruiser vector tommyboy jean banker horizon chainsaw button bigbear forfun abraham astrid
carole andres sharky royals christina small misfit work yousuck louis fallout scania maxx nudist getmoney
budweise song believe brighton absolut kungfu kostya monaco gunners vfhufhbnf mamapapa minime blueboy penthous
chrisbln steph whitey europa jade bertie daphne groucho champ benny grant mirror village trader stroke walrus
susanne number sabres nipper woman floyd snowboar undertaker flounder moneyman patty bottle kahuna canadian
viewsonic coolguy rules downtown wagner strange fabric trisha italian ybrjkfq cypress eastside sneakers passme
topher golfgolf barber sinbad frodo panasoni craig alfa mybaby skidoo massimo back jillian sparrow senior
dalejr thecat snapple mondeo leanne emmitt thanatos ghjcnjnfr maximum smegma thesims whitesox chong bonkers
poseidon musica doug johannes gargoyle olivier hambone bluedog intruder sunnyday cyber compute kids smelly
spawn wapbbs answer studly poppy paper simona solution newcastl adonis goodman sexxxx europe goldstar again
quantum buckshot static dollars titanium erica danzig jabroni library journey beastie chrono dang edwards jane
gunnar federico korn custom lance assholes daewoo jess briana watcher albina sunflowe dorian babyblue premier
staples nike stereo westwood usnavy boomboom fresh sasuke dharma pisces motherlode multiplelo hang bike sapper
scanner marius zeus racer callaway user bayern rover lamont rivers snoop over walmart micheal starfire theend
steel erotica aaliyah doogie renee paintbal paint tyson newbie knickers lokomotiv hotred ufkbyf laurel shawn
wasser jessic thirteen rjycnfynby avalanch outkast truman magpie scout philippe poetry havefun michell cubbies
losers hotpussy deejay fghtkm droopy blossom allmine zerocool janet tomorrow godfather abby greece second
reading greene sascha busted ming bimmer original ocean anne builder demons nitram pudding bounce donuts fucku
jeanne idontknow aleksey vfvfgfgf leonid smokes mylife beerbeer sims redfish working rodman beaches hairy
contact start luis bogey prissy gegcbr tights insert carla dante beretta francesc jewels searay padres celeron
mittens quartz ziggy diehard micron syncmaster cornell christie stunner rtyuehe hoosier peyton paintball bing
monalisa queens terrapin spongebob buzz attitude backup whisky clevelan ling cedric marin barefoot artur
chuckles barrett meathead bigass titty gretzky kosmos cfitymrf biggles cambiami thongs blessing what
aleksandra twinkle gladiator gollum southpark rabota mazafaka goodboy carbon scuba tango stoney brent weaver
will volvo footbal pianoman gaston casanova traveler clark stumpy hawkeyes clarinet looney mommy maggot felipe
bucket eduardo freeze sound sexyman johnboy dian snapon deeznutz warthog vegas rooney futbol filthy steam
carina mustard boricua meowmeow maste mellow sunshin bengals combat goofy whatsup sauron krystal alina prophet
loco lovesex twins triangle booker reefer nickel venice xander strip valencia lord rhiannon smeghead valeri
andromeda diver cerberus sputnik groove lambert usarmy more tiberius zigzag sting bean welder radio petra
focus gabriell candice salamander eternal motley resident hayabusa marcia rambo together rainman poochie
purdue redwood ripple buzzard wang redwing boobie juliette monke hokies phish crjhgbjy jagger rockford shou
tuan goldwing brewster bermuda zero thegreat proxy confused badgirl lola bacardi derek whiskers spaceman
starman trial karma claudio allstar carolin gesperrt lynn swords rasta wildman nikolay kang slinky wrestling
mohammed pinhead hacked sersolution overkill rhfcjnrf mishka banane person public fester something lions
helmet ripken frisky changed games higgins trapper piper windsor supreme kaylee athens norway runescape oasis
jill hurley lightning dbrnjh shun chun darius chip hill midway kool hoosiers vinnie recovery cicero napster
lionel amazing tracker laser adrienne roadking menace secure stoned thedog sacred squash nice smoking pony
feng illusion woohoo medicine antoine bagira megatron orchid reader comet clown zippy company doghouse stacy
wild army maxim paula bravo buddah jaybird chuckie look morning dino peach todd hanna chuang mortgage idiot
heineken saleen rulezzz massage sonics moonlight butts pobeda benfica poker kashmir realmadrid balloons
optimus chunky tinkerbell chou shai common starter brewer babyface pants gregor dogfood hardcock deluxe
bigmike blackbir bookworm hampton jeffery salomon godfathe meister angus intel seahawks talisman blackjack
eraser collin pissing hawaiian zhong mian michae berger alphabet tricia beautifu misha maryann adams jenn
riley really mortimer tongue century sancho remote darkman buddie roadrunn pizzas lexus medusa health stalin
toledo cubswin dutch lilly beowulf charlene willia christmas pool handyman f**k pacers unique eleanor clouds
cgfhnfr breasts chinook just4me nuts wedding calgary dutchess heckfy ludmila gong nova shell lori site because
cheater famous delphi cathy wareagle martine gromit sponge ashlee valkyrie yoda glory passwd idontkno smiths
mohamed teddybea killers boxster five dragonball babybaby mermaid satana bhbirf foryou qazzaq hong puddin chao
shang zhei quan inuyasha stanford peacock assword misery desiree barnes sullivan beamer diggler medical
wishbone circle property ripley thedude cloud fisting alexia beemer jayden gameover redline venera salsero
lust fytxrf sergi kittykat spanish sinister india vedder gonavy manowar novell lang colonel rancid diao chrome
friendly destroy titten electra polly geoffrey eureka onetime phone katherine otto lakota claymore hotbox asia
banner madina manuela bitchass ruby sporting bartman matthews checkers playing carmel gabriela dfcbkbq nimbus
wrestle bulls jktymrf alexalex preacher gamecube mustafa svoboda circus armagedon alenka playstation leng qing
cong zheng magical park claudi rhtdtlrj pablo thumbs camper doitnow goaway subzero charity hootie face pissoff
jammin beth blackout crow darrell cocaine bcfields skylar rolling loaded milkman lotus davide bigbutt electron
johann cheeks skate silverad lighter hassan pothead gobucks squall thunderb courage pippin ghostrider antoni
kaitlyn neng peng miao teng xuan xiao reynolds cannabis xerxes ipswich ninjas mango farley lucille pinky
jimmie nude dieter annika mitch southpar marika dickie jetski finance tdutybz dianne forward jenkins bright
absolute bilbo musashi ferris iamgod lipstick laurence mandarin quest tottenham adults yfnfkmz kleopatra
tulips nong piao ruan zhuang chai dirtbike sheba pickup dwayne othello mari katherin forum sonny rider warner
northern cinema cameltoe petrov bluefish fuzzy pheonix iscool secrets elite toon modena bert marsha slippery
kissing caravan divorce tank beatle jump akira sanfran cheech badman samtron paloma yang dolores sveta shadows
mollydog annabell starcraf ghblehjr vasilisa jameson chuai deng qiao zhou zhun jiang luan sang ying beans slim
illinois warning ebony meat jockey deadpool hillary bearcat caprice farscape evan bigtit lassie zappa sander
nicol sunflower hopeless sheriff carpedie bank asdfzxcv sherri march barton shepherd gatorade keegan high
toolman barker spectre pussey nuggets borussia mantis banzai ariana flexible mullet graphics fyutkbyf mancity
templar stories yfcntymrf fergie records thedoors gawker pussyman skyler elizaveta colton huai seng xiang
zhuai guai solo moritz monte lemon strength talon rhino susana sonoma three mack spinner allan keller webmaste
grease augustus raquel alejandro chimera rufus stretch ticket bacchus kendra twenty corsair kinder argentina
corleone zhai spice vampires domain iomega heater hover ltybcrf artemka xxxpass qiong ting hippie jing reng
tian tong poland deutsch babylove becker speedo brett oceans slapper letter harvard bonjovi mazda virtual
cosmic leon snuffy blaze sergeant dragonba stonecold hellos jacques register buttercu huang millions millwall
patience chrysler merlot bullfrog latinas istanbul phoeni ashleigh kotaku universal noelle binladen artem
shanghai castro ceng chuo jiong xiong shei meng hans wraith pierce jayhawks kilroy amateurs dotcom cattle
daemon ntktajy barbados renata thoma balance chan nomore pdtplf canyon kayla jackpot mets pulsar baron marker
chippy nightmare monarch hamish aubrey reds knockers dipshit alexey malone athlon hubert chevrolet vadim
everett napoli myname belly cobalt counter dialog augusta smokie cristian coolness cougars screen criminal
hardware ramones bobdylan ning capslock rong zaraza ciccio teddybear alisha chui liang pian niao gadget shiner
laurent fulham missouri carlitos dwight helene halifax dogshit entropy coldbeer silent lost silly netscape
boom edgar county deep freeway syzygy andromed game media wings brigitte yeahbaby diego yolanda eldorado
hollow crack eastwood gunther paranoid anita sexyboy soulmate gooner drunk persik lesley geneva microphone
kakashka fgtkmcby mclaren spread geng shuo zhui duan nuan qiang weng shuang bamboo brittney fastball creature
cards just4fun matteo fuckyo hack smashing foot washington arlene baggio carlito hopeful astro hondas snooker
sophi redbird bigblue dynasty mephisto trainer iceberg shitface fountain specialk estrella some generic
buddyboy stevens arcadia manning nikitos piramida violetta piano salasana maxxxx zang shutup thing suan
heritage liao browning homerj tiburon obelix kris chopin insomnia hooper promise cygnus theater romero jelly
plasma kissmyass here submit budapest jayson sexysexy jorda citizen sahara pinkfloyd card stroker pavlov
pasword amigo heynow arturo fight ventura sandwich fraser yummy homeboy royal testpass gamecock milo magician
female wildcard magazine telephon bigfish tripod kuai lazarus cleo licking dundee brodie misfits slavik
rochelle sleeper seeking pringles butcher patric nanook darklord loveless radiohea cang shao sheng guang shuai
xing karin hughes giorgio maxime sphinx reckless triple baldwin taxman orient desmond married zhjckfd mordor
hunt romano jiggaman ramsey officer lovebug classics hooligan pluto georg bolton scrabble jezebel major
jellybea shock drakon seadoo mexican pharmacy door lena abnormal patrice concorde alfredo cdtnbr puffy
islander chantal jakejake yjdsqgfhjkm bunnies bushido kazantip strawberry verizon maksimka dupont crusher jiao
zong zhang pang premium wg8e3wjf corey goat diane channel project hole cthtuf arrow meagan tootie bounty
kfhbcf kirsty howdy ramrod sweetnes bummer corolla andersen blond race darryl senator ferguson donovan thelma
dynamite gertrude doomsday rhjrjlbk hjccbz players mariposa ozzy excalibur marcello buttfuck moore samsun
masamune zhao niang zhuo darlene bessie brains north attila clowns chestnut woofer model moses someone lindros
tiny dottie civic july anthrax lilian imation beacon tripper vsegda ursula fullmoon spiker sporty force
pornporn citadel jacobs volcom dynamo amerika bombers burrito inspiron forsaken spock mallory lantern nextel
goirish snowboard haggis callum violin lollypop insanity placebo creation glacier stepan zander dabears
katarina iloveme sexxxy moonbeam webber gonzalez tiao dogger pecker stiffy senators create june wingman
pumpkins windsurf ernie mick watch jarvis zephyr fishman dell reddevil wanted sheridan nichole bronze concord
rjhjktdf kellie baker zalupa killkill avenue asddsa bunker wrench paddle schalke cobain shanna poopy broker
mouth woodland yvette suicide vanguard aviation exotic heat stanislav superb fergus mihail vfibyf mobydick
sausages tuning francesco ganesh anastasiya nevermind presiden faithful kerstin vfitymrf varvara happiness
robotics zuan nang shui normal deer bigcat store tech temppass onetwo postman weird uranus highheel aloha
cigar puss stylus gobears duckie stratus thong pippo conover soprano jingle firewall polopolo dolly pepito
piazza radical alone mail boxer reload evolution grande tipper battery dogcat drive kirby candace digimon
bombay mariana sowhat lips download fandango kamila popper gore beng rang bian cuan lenny mypassword louie
earnhard dancing simmons airport snappy angelika fishin boxers icehouse cramps basset dogboy hall abstr
softail titan santa killjoy fischer electro mygirl delilah nutmeg christma kittens krusty script zaqxswcde
bigboss flores guyver coach praise prowler harvest latina clit moreno erin spikes jubilee shan choice yugioh
toaster pineapple harrypotter gorgeous namaste carnage yong zeng biao heng keng kuang alissa nigga dayton
chriss niceguy magelan almond club bumper partner marty spongebo erika judy ghosts hookup bigben wifey enrico
starstar gilles chillin superma radiohead havana lumber pistons viktoriya gameboy robot santafe holidays
jennife mckenzie reddwarf cascade kidrock pinball isaac banger arrows platypus foxy abrakadabra doofus passes
shanti barron marianna longbow services heroes living mankind stasik jets beardog longjohn glenn alessandro
garion live juanita honolulu nygiants busty install niceass string boozer mars astra abbott puffin dogbert
queenie muscles highway visa cottage compton steffi romans beerman windmill guitars earth freebird slamdunk
snowflak tasty delight nights biology emilia bronson frost irishman badgers state bergkamp pixies training
playstat milk oatmeal mudvayne airwolf season lottie dudedude jackjack johndeer zildjian magnet vjcrdf hammond
ramirez mang aptiva anai gidget stop kjkszpj manolo bruiser chilly medion josephin giraffe jared paulina
fishbone edison caught gasman pocket moondog charter camila impact tbone bigblock rudy towers krypton hallie
jefferso pelican altima clippers getout compass kimmie chambers winners paulie spoon sucking albany toffee
theatre never pavel climber marlon micro thisisit armand ultra aladin monkeybo comfort epsilon idunno stress
hounddog pallmall kate webhompas monsters picturs sairam easter cobras ballin comanche landon severin whiteout
roadster basebal drifter easton werder norwich stubby stefanie clay gene ellie versace food visual heinrich
record bowwow ellen undertak demo hookem anastasi fiction medic colnago booster festival zzzxxx coolcool
qwe123qwe sinned foreve squeeze anthon diving shocker hewlett cross sutton choochoo milan defense fidelio
welcom word lithium kisskiss cbr900rr british franc kings lovelife hellboy chipmunk saiyan bluebell federal
trust format kjrjvjnbd ctrhtn hollie celeb fuckinside kirk washingt tkbpfdtnf sensei smirnoff mydick spam
macbeth cabron guess pipeline clyde dalshe zebra mortal fishhead gustavo vintage pigeon carver gypsy
konstantin beta freefree newcastle krasotka komodo juicy punk starligh flyfish wireless carman manila olesya
salome lowell torpedo switch motion sharp toejam julien puppet buceta scoobydoo koroleva lineage michaels
redrose close yogibear redbaron codered frogman tatarin azazel moskva kitchen freesex president news mykids
bitter highbury tranny redfox username achtung spotty survivor program prayer transit sanity seagull flanker
cocker wanderer fuckhead zodiac isabell costello virgil nutter rockies irinka washburn catwoman upyours kelvin
lemonade chilli bearcats chef itsme gravity chevys solitude cocksuck minerva deeper ohshit vera rober slowhand
tommie ross jsbach lorena dinara paradigm lilith nostromo borabora arkansas chiara savanna presley bologna
terminat habibi contest sushi markiz sigma bdsm blam fantasia mildred grandpa underground cnfybckfd ghbywtccf
bigbob joel slater comedy marti grand georgie wildbill smart kent larissa gilligan blast hornets brain
berkeley birgit maggi armstron corndog hilary troy lane piggy destin tropical sundevil shinobi horace gagging
hurricane volkswag wasabi nurses zanzibar reilly angelus chinese sissy sunfire tonight sonia sneaky report
coventry gtnhjdbx sekret undead qazws madcat hotone eastern daniele lasvega amorcit wasted sidekick yfnfkb
revolver cleopatr nfytxrf jermaine gbhfvblf kalina cisco everlast hopkins nitro south nation tinkerbe lamer
boating glass bluesman weston leroy customer physics paolo quentin messiah hitachi marjorie krissy shawna
conan woodie troll groups spikey fatty villa denmark stephan birddog cyborg keenan tokiohotel straight
nautilus kieran rubble highlander redeye justus firefire from schmidt longdong boiler margie suckers waffle
khan sonata lopez there skyhawk joebob armada reflex threesom americ goten loud sisters valentine yuan cole
bighead matthias changes descent fenway taco eggman jonny dogface bowman irishka shibby antonia astral nudes
teenage enterme thecrow score complete rivera belmont tigge junkie fredrick daniels vickie bennie skinner
razor umpire blanco fearless citroen rollins sluggo torino antelope marseille aramis emilie gryphon malachi
viewsoni ethan yeah marble reptile chandra kille dindom evangelion handball barselona draven sandrine sprinter
fyfnjkbq stinker palmtree hotties rampage seabee chick gordo bigpimp question boytoy quasar carpente amand
luca pasadena biatch benoit glock coldplay expert audi castor deadly fairlane elcamino callisto glamour datsun
studman hanson mentor tomahawk shamus gladiato diaper keisha styles squeak cayman runaway dentist navy skip
fantomas thewho zippo castillo luck arianna honeybee papito holycow ukraine doors wildwood skibum gambler
helper best malice karachi jewel excite toilet corinne morton johngalt sweetness options loretta mcdonald
sf49ers palermo playa lambda gideon matthe medved cheshire superior ministry trinitro pebble bismillah roses
elefant capricorn harlem nikolai vendetta bobdole manfred biker margarit bigpoppa ijrjkfl asimov dominik
limited vitamin calibra zarina perry iforget glasgow shrimp antares hola antonina jamess hetfield warez
bigones cutiepie chapman bolitas dimas nonenone bestbuy papillon baritone knock eight stream sleep stephane
freefall vjqgfhjkm show priest jules mischief rogue hate foxylady flip ernesto dominion vienna macman enforcer
devo parol tophat megane dungeon leedsutd f00tball mingus skillet robins twiggy bitchy giggles remingto
alberta ducks rfvfcenhf book otis derparol quebec emperor buste synergy shakira older asdqwe mamamia cleopatra
rosario finland modern carnival dmitriy coolcat ghjuhfvvf knuckles mahler kayleigh klaste notused bigdawg
grinch chips letmei slugger mental harddick brand bozo paco kojak tabasco chelse spud rico keepout kokomo
firefigh addison blowfish hugo samira sexylady sevens stacie dimples post tuna alexandre whiteboy films
cromwell magneto kernel carroll minemine dontknow acmilan wp2003wp sanford referee lakeside polish screamer
calimero portal kfgjxrf conway rockie dfktynby francisc swinging trucking obsidian sales auditt oxygen roswell
tower papers popova giovanna thecure bigbang lfybbk pizdec zoloto marijuana kimball jaguars kerouac stryker
ksusha entry roma maple choke cassandr moonligh fenris duffman blueball bigbooty cars wrestler salope sexxy
dinner building mopar cecile fishfish paramedi capricor robocop rimmer hardone w_pass evil nomad nuclear
asgard series advent universa jorge kestrel spanner guido cheddar lalakers acura cherries anchor cold yoyoma
darkangel aspen bahamut whistler smackdow galant bukkake leopold option strawber facebook susanna bookie
crusty qwedsa nine extra transfer breanna mothers clarissa peachy prozac p@ssw0rd loki bootys argentin flame
bricks slimshady dkflbr krolik joshu korova johncena magpies pictures cevthrb suckmydick spanker dogpound
impreza notebook prospect bettina gymnast jktxrf seneca ksenia rudolf marquis huge daylight tribal zack
johndoe hejsan jeannie lemmein salem petrova clutch django sexgod sexxx capetown tupac ratman vlad fortress
canucks virus chocha serpent wallet inter telephone eggplant camero roofer nazgul fussball cardiff fktyrf
amore factory budweiser alanis marseill janelle wealth addict goodgirl timeout wolfpac camden tenchi godlike
university turnip beaker k.lvbkf repair nbvjatq vehpbr southpaw sylveste redhat wingnut patrol magellan vampir
assasin aikman trailer mariya taekwondo sonyfuck style llamas clifton irene punch noname goldfing jumbo helmut
maveric ricard antony ballet pentagon sawyer gina pearson hotgirls flasher tracer boater shoes peppe joyce
cornwall goodie devon benito butters sixpack mandrake earthlink lookout slammer venture gagged onion truth
aries lakewood loveya dogwood moonshin ring wyoming suburban challeng olympus volkov opendoor commande hoops
jonathon seymour ashle oreo murzik navigator right gratis myrtle native trip twelve hellokitty arctic fkbyjxrf
rasmus wormix millenium radar gerrard goth asians camaross bluejays gaell lekker qazxcv borders davies midnite
lloyd beater whatwhat optimist damon gotmilk clock decker larkin road loren redskin hung bremen enternow page
bimbo hattrick aaasss dejavu markie screw daddyo bordeaux blaine rough alchemy hott real ilovegod solaris
proton links cardinals marriage disco peggy spence fanny coming swedish espresso auggie vbkfirf dougie
p4ssw0rd richar noway nightwish saigon holes jocelyn platon speedway devin leeds timosha roadrunner ironmaiden
mackie supernov delfin toriamos ceasar trans oberon vjkjrj capecod glow nevets mamacita derf sandie jaime
longer cowgirl stigmata munch gonzales alena data shag nineinch waterboy klondike ilove finally bomb spiral
boulder odyssey amigos somerset pain burns mulligan krokodil explore lawson charon peeper redcar fellow ambers
sloppy savior schatz moron hardball azertyui republic patch reggae canuck romantic vauxhall angelic emilio
doggies advance around spoons rfntymrf almighty deputy tosser stratfor mississippi suckdick eating intercourse
closer lenochka marijuan globus sterva domingo limewire terefon coors suslik steaua bledsoe greedy iriska
htubcnhfwbz zasada sandr beezer funstuff evgeniy bball patrici cuervo printing pastor funky theforce chiquita
strap yessir daman beech streets wxcvbn maserati berry qqqwww geezer coral cabernet joecool nastia egghead
doris sheepdog terrell jomama kane armando hairball christa aileen clarke insight afrika vancouve tender
munich grandam brady luciano alcohol sheep default idefix cyprus trees scheisse mooney ambrose hoffman
pimpdadd baltimor jennaj norbert call jaeger watford davinci mizzou gocubs square pigpen houdini jewish tomas
kirkland ophelia riccardo another rodeo luna bonanza lhfrjy sigmachi revolution firenze selina absolutely
lback ghbrjk rfhnjirf cvthnm colonial toolbox hunte ringo bongo azert junk banan howell liliana medina riders
ilikepie toonarmy laddie footjob kronos eskimo wolfen barley pancake bigdicks dabomb cashmone junio monic
lolol myxworld audio kristian samoht dominiqu joemama gabber toocool ariel twinkie zxasqw marcelo darkange
persona scrapper delaware progress kurt shuttle link gabriele smoothie slimshad youtube franks norris yasmin
outside hottest cumslut tripleh mann starr morales vqsablpzla pathfind trace elisabet doit evolutio fishon
books flicks velocity ranch annmarie gthcbr biggun dolemite vagabond outback sexo woodstoc macleod plastics
javelin bootsy aolsucks c2h5oh sofia redbone klizma rachelle petunia pumper all4one mohawk lobo billabon
rockin baylor koolaid granada allegro alinka nevermore mikael forgetit montag beloved breaker honeys reginald
sheeba wives dukeduke archange metroid minimoni wizards hellsing rocknrol fabio zaqwsxcde wanking awful
morrowind friendster irving goodday modelsne bumble nataly juliana cirrus samm nittany dogbone storage punker
purpl futurama skateboard esquire homemade kiteboy herewego bedford dirk lonesome boxcar pornking blackbird
dickens four climax gotribe bleach cheeky cucumber vipergts awnyce muhammad jeepster harbor acidburn harald
calling dingo fireblad christi pinnacle shodan fallon deniro dudeman harrier jellybean buffet mariner foolish
wildone peterbil allgood fields salami bugs estelle lighting mega butkus elvisp homework russel donner doktor
tycoon cement ottawa bigguns lillie fellatio emmett kiwi barfly baracuda newyear flipflop raleigh singapor
sperma maxdog opennow thedon sedona sixty terra blunts linkin lander alisa crackers doubled warhamme proview
masterbate status females flamengo behappy lfitymrf starwar snowbird corwin azzer lagnaf daughter cubs
navyseal carebear protect kamasutra bastards delmar musical deaths metall steffen wiseguy pimping whiplash
lara adriano boyz hatred reserve draco rainyday mercede grin stafford mone motor ontario stang gardner weekend
jakarta shonuf clovis drum gotham jughead golfgti dooley sand nightmar wetter comein meadow chessie marshal
phyllis mutant dingle chelle nautica haley camber dragonfl senna bigjohn heels stickman sambo hiziad sexybitch
puppydog deville pacino paragon pointer tarpon sprout durham wheeler spliff sick rockwell vfntvfnbrf meliss
narnia eleonora lefty chewy payday atlas alleycat ambrosia drums linden trustme austria phialpha exchange rage
lokiloki tarakan cartoons bungle contract kolokol daisydog penetration laetitia gohome pushkin leigh gianni
wordup orchard adrenalin goldeney luckyone tuscl escalade gerbil blanca widget fyutkjxtr touching sites pookey
charisma inlove rainbows grass kolbasa newark bootsie interne raphael rated cleveland henrik roll jenifer
cocksucker point dragster bismarck cambridg cliff honor buzzer supra treefrog kerry reason frogs treetop
catcher dicky xantia daisey siobhan lister dome strelok auto gamma jello hawkins prosper pitch stan workout
walton catnip trauma sebring michal nounours kittie burning driller thierry lumina speakers brennan rabbits
colin buttercup neon atticus puzzle mallorca delaney burn checker jabber melrose zyjxrf normandy ariane
dbnfkbr bambi lucia wilder killa masterp playball scamper wonderful signal base benessere freee getting
smackdown melons pandas chains asdffdsa melina sexybabe cannibal fosters beethove burner nthvbyfnjh meow
malaysia azertyuiop rocknroll bynthytn aprilia venom italy meier shen pavement stockton peppers tantra
guillaum redd manny giulia caster readers mooses worthy royalty jonas rita trustno hansol gumby enrique body
paulpaul gannibal earl compact frosch skylark hallowee kenobi kittys andrews terrier dirt farm marbles
ticklish frenchy offshore jazzy sexyone algebra hyundai hotass sexman olive leinad farmboy middle clement
amethyst letsdoit gofast thrasher plato soul ride notredam candyass hannes spooge systems gatsby junkmail
ladder uptown shower chill karine matty airman volleyba stayout abacab blanche buckley bouncer vodka bettyboo
shauna manga muslim cutie ilikeit constant longhair their kaboom elmira amatory q1w2e3r navajo alcatraz olenka
mynameis larson powerful sephiroth panter casio summers nikolas rugger sparkles skinhead sonysony snicker
pancakes pilgrim ananas contra sheldon generals grisha montecar briggs ploppy renate radeon sergbest talbot
pathetic errors springs needles restart stock hiking auckland jimmys pearls billbill hazard capitals pizzaman
fitter biit tazz ulysses jehovah stitch itisme delpiero wind neville nico virginie alive grunt emil octopus
tampabay ratboy gabby playmate dfcbkbcf carrots istheman jarrett yamato rumble ilovepussy wonderboy montrose
dunlop werdna cassandra clemente tralala collie swoosh dreamcas track sliver londo cocoa rfgecnf rollin
painting makaka thebear lockdown blacklab riffraff legs kahlua fidelity alexi winger edmonton pressure
streaming amstel supernova fujitsu fluff samanth panic napalm camil blubber tujhrf gatit titts camping cable
babycake budgie dani vfndtq hewitt spot frederik motocros rustydog pinetree duffer ollie benton tetsuo glasses
nestor feelgood cola cleaner rocco smirnov roxy dummy loose maximo iceland tigercat citation blitz icecube
burnout puck twist asses noel panhead adelina hanuman sunlight cupoi bigtruck phat rolex exeter kingking
lilbit rhubarb morten custer buford papamama mouser bowtie perkins toast husband betsy jefferson serious
elements zapper harriet cummins semper herring accept bucky lemans winona finder treble stellar saskia doreen
chavez furball corner titfuck salman bagpuss darina francine redstar revoluti sniffing chouchou quick gareth
usmarine dresden julio doom malish planes videos enters nympho pajero left4dead booyah conquest delldell brest
eunice momdad slonik nursing bismark garnet bonner gogators cashmoney blobby dimitri fabienn iklo cyrano
crappy volcano eatmenow renato goodyear budd spoiled kamilla hogtied omar lunchbox mantle piercing makayla
cyrus mufasa beau boobear town rudeboy riversid hemlock onions holger scissors hound crescent erection libero
hair entrance fduecn italiano matchbox ramjet acapulco mohammad trek weiner lebowski ridge surprise shampoo
loverman monk abracadabra duane dnsadm fisherman toomuch athome whatthe someday celebrity madagaskar marcin
valery maison forlife mindy azrael alain dreaming hardy hfytnrb macintos tennesse hardwood sweetheart pride
invest mariam rhfcfdbwf ronaldinho discus fabulous sextoy this instant duckman caracas begemot parlament migue
sylvie nadia vegitto requiem misiek altoids rhinos liliya dragonballz retire these hellas rfhfvtkmrf capcom
rjhjkm kicksass dental hores harman sharpe lookin poptart pugsley gamble hawks gladys granite sqdwfe goldeneye
interest harmon melani zach spleen alfonso jeeper natedogg emanuel locks lizzy menthol pharao alterego fick
bauhaus alexxx brook jerk vaughn pong lake ibrahim mogwai owen benjami nicky adelaide smurf skirt nineball
shady mafia tiamat aircraft bama having dipset logger mamas gerry trenton altair jingles mallrats backbone
clever stanton dipper innocent unlock chen donjuan harle termite missie diamon encore forbes follow trash
freestyle zerozero shovel matisse anonymous laserjet leeann parkour waterman ballsack bluejay shakur welkom
dangerous ghjcnbnenrf hacking flyer information babybear highlife raduga favorite aisan probes sucked ljxtymrf
becca trinitron beat clips thumb desktop things supersonic blueberr satchmo natalya pooky victori legos glover
boroda tamerlan chamber mariel bathing chess mangos rapper darkone pokemo douche redwine ismail humphrey justi
maximka cashflow implants juniper grayson bobmarley shojou gramma princesa bendover giggle cloudy gotenks
sopranos larsen kappa worker spark placid downer screwy amiga hillbill klaus simons mortis leland binder
border chemist oral gone carlisle protocol dynamic ajax talks tuxedo cook amature triplex dudes turbos edge
ringer joke grimace jarrod socce feathers riddle xian wonderfu surgery bourbon dickdick bite annaanna
pimpdaddy baura commander helsinki basil cyclones bong macaroni pollux funk motown fiddle thebeast marauder
rodrigo oyster listen fruity chachi hand gizzmo blinky prime hancock espana lennox corinna frisbee lancia
sapphic homepage dimadima womans halloween pinkie cheerleaers shopper josiah redheads weller scouts photon
garlic greywolf estrell diva ghjcnjq alvaro egorka rfhfylfi reeves picks reloaded holla mierda gigabyte
dortmund korean karaoke sashka godbless allday jurassic experienced thebest nimitz trigun coolhand kcchiefs
dicker baboon barefeet jesper belkin zoomzoom madcow greedisgood
`;
